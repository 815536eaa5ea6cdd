import { roundDownSignificant, roundUpSignificant } from '#shared/utils/compute/exposure'

const grouping = new Intl.NumberFormat('en-US', { maximumSignificantDigits: 15 })

/** A ratio the wearer must be protected against: rounded up, never flattering. */
export function ratioText(value: number): string {
  return grouping.format(roundUpSignificant(value, 3))
}

/** A concentration that may be worn in (an MUC): rounded down. */
export function mucText(value: number): string {
  return grouping.format(roundDownSignificant(value, 3))
}

/** A measured or converted concentration: three significant figures, rounded up. */
export function concentrationValueText(value: number): string {
  return grouping.format(roundUpSignificant(value, 3))
}
