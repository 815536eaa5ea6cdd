/**
 * The one reader for every number a person types or pastes (entry grid, count series, imports,
 * headform and readiness readings, calculator, lab). The organization chooses the decimal mark;
 * the other mark is accepted only as a thousands separator in groups of three, so "12,500" is
 * 12500 with a point, and "1,5" is refused rather than guessed. See DOMAIN.md "Typing numbers".
 */

export type DecimalMark = 'point' | 'comma'

export const DECIMAL_MARKS: readonly DecimalMark[] = ['point', 'comma']

export type NumberReading
  = | { ok: true, value: number, asRead: string, differs: boolean }
    | { ok: false, empty: boolean, message: string }

export interface ReadOptions {
  decimalMark?: DecimalMark
}

// Spaces people use between digit groups: space, no-break space, thin space, narrow no-break space.
const GROUP_SPACES = /[ \u00a0\u2009\u202f]/g
const HAS_GROUP_SPACE = /[ \u00a0\u2009\u202f]/
const EDGE_SPACES = /^[\s\u00a0\u2009\u202f]+|[\s\u00a0\u2009\u202f]+$/g
const UNICODE_MINUS = /^[\u2212\u2012\u2013]/

function refused(message: string): NumberReading {
  return { ok: false, empty: false, message }
}

function marks(mark: DecimalMark) {
  return mark === 'comma' ? { decimal: ',', group: '.' } : { decimal: '.', group: ',' }
}

/** Digits grouped in threes after a first group of one to three digits that does not start with 0. */
function isGrouped(integer: string, separator: string): boolean {
  const groups = integer.split(separator)
  if (groups.length < 2) return false
  const [first, ...rest] = groups
  return /^[1-9]\d{0,2}$/.test(first!) && rest.every(g => /^\d{3}$/.test(g))
}

/** The value as a person writes it in this organization: decimal mark and spaces between groups. */
export function formatTypedNumber(value: number, decimalMark: DecimalMark = 'point'): string {
  const text = String(value)
  if (!Number.isFinite(value) || /e/i.test(text)) return decimalMark === 'comma' ? text.replace('.', ',') : text
  const negative = text.startsWith('-')
  const [integer, fraction] = (negative ? text.slice(1) : text).split('.')
  const grouped = integer!.replace(/\B(?=(\d{3})+(?!\d))/g, ' ')
  const { decimal } = marks(decimalMark)
  return `${negative ? '-' : ''}${grouped}${fraction === undefined ? '' : decimal + fraction}`
}

/**
 * The value as plain text in this organization's mark: no digit grouping, so it reads back as
 * itself and matches option values ("2000", "0,5"). For filling a field from a stored number.
 */
export function plainTypedNumber(value: number, decimalMark: DecimalMark = 'point'): string {
  return decimalMark === 'comma' ? String(value).replace('.', ',') : String(value)
}

/**
 * Reads what a person typed. A refusal says what was read and how to write it, so the cell can
 * show it beside the field; `differs` tells the preview to show the value as read.
 */
export function readTypedNumber(text: string, options: ReadOptions = {}): NumberReading {
  const decimalMark = options.decimalMark ?? 'point'
  const { decimal, group } = marks(decimalMark)
  const shown = (text ?? '').replace(EDGE_SPACES, '')
  if (shown === '') return { ok: false, empty: true, message: 'Nothing was typed here.' }
  if (shown.length > 40) return refused('This is too long to be a reading: type the number only.')

  let body = shown.replace(UNICODE_MINUS, '-')
  let sign = ''
  if (body[0] === '-' || body[0] === '+') {
    sign = body[0] === '-' ? '-' : ''
    body = body.slice(1).replace(EDGE_SPACES, '')
  }
  if (/^(infinity|inf|nan)$/i.test(body)) return refused(`'${shown}' is not a number: type the reading in digits.`)
  if (/^0[xob]/i.test(body)) return refused(`'${shown}' looks like a hexadecimal, octal or binary number: type the reading in decimal digits.`)
  if (body.includes('%')) return refused(`'${shown}' has a percent sign: type the number only.`)

  let mantissa = body
  let exponent = ''
  const e = body.search(/e/i)
  if (e >= 0) {
    mantissa = body.slice(0, e)
    exponent = body.slice(e + 1)
    if (!/^[+-]?\d{1,3}$/.test(exponent)) return refused(`'${shown}' is not a number we can read: write scientific notation as 1.2E+03.`)
  }
  if (/[^\d.,\s\u00a0\u2009\u202f]/.test(mantissa)) {
    return refused(`'${shown}' has letters or signs in it: type the number only, without units.`)
  }

  // Digit groups separated by spaces.
  if (HAS_GROUP_SPACE.test(mantissa)) {
    const [integerPart, ...more] = mantissa.split(decimal)
    if (more.length > 1 || exponent || !isGrouped(integerPart!.replace(GROUP_SPACES, ' '), ' ') || integerPart!.includes(group)) {
      return refused(`'${shown}' has spaces that do not group digits in threes: write 12 500 or 12500.`)
    }
    mantissa = integerPart!.replace(GROUP_SPACES, '') + (more.length ? decimal + more[0] : '')
  }

  const decimalParts = mantissa.split(decimal)
  if (decimalParts.length > 2) return refused(`'${shown}' has more than one decimal ${decimalMark}: keep one.`)
  let integer = decimalParts[0]!
  const fraction = decimalParts[1]
  if (fraction !== undefined && fraction.includes(group)) {
    return refused(`'${shown}' has a ${group === ',' ? 'comma' : 'point'} after the decimal ${decimalMark}: write the number with one decimal ${decimalMark}.`)
  }
  if (integer.includes(group)) {
    if (exponent || !isGrouped(integer, group)) {
      const withMark = integer.replace(group, decimal) + (fraction !== undefined ? decimal + fraction : '')
      const withoutMark = integer.split(group).join('') + (fraction !== undefined ? decimal + fraction : '')
      return refused(`'${shown}' is ambiguous: write ${sign}${withMark} or ${sign}${withoutMark}.`)
    }
    integer = integer.split(group).join('')
  }
  if (!/^\d*$/.test(integer) || (fraction !== undefined && !/^\d*$/.test(fraction)) || (integer === '' && !fraction)) {
    return refused(`'${shown}' is not a number we can read: type digits, for example ${formatTypedNumber(12.5, decimalMark)}.`)
  }

  const canonical = `${sign}${integer || '0'}${fraction ? '.' + fraction : ''}${exponent ? 'e' + exponent : ''}`
  const value = Number(canonical)
  if (!Number.isFinite(value)) return refused(`'${shown}' is too large to be a reading.`)
  const asRead = formatTypedNumber(value === 0 ? 0 : value, decimalMark)
  return { ok: true, value: value === 0 ? 0 : value, asRead, differs: shown !== plainTypedNumber(value, decimalMark) }
}

/** The value, or undefined when the text is empty or refused (for places that show the refusal elsewhere). */
export function typedNumberOrUndefined(text: string, options: ReadOptions = {}): number | undefined {
  const reading = readTypedNumber(text, options)
  return reading.ok ? reading.value : undefined
}
