import type { ConcentrationUnit } from './exposure'
import type { MaximumUseConcentration } from './selection'

// A pure gas or vapour at 1 atm is 1,000,000 ppm by definition of the unit (parts per million by
// volume), so APF × limit above that is arithmetic, not a concentration anyone can meet. Long
// before that the lower explosive limit, the oxygen content of the air and the cartridge's own
// limit govern (common practice (no published source)).
export const PURE_SUBSTANCE_PPM = 1_000_000

export type MucNoteKind = 'above-pure-substance' | 'no-idlh-cap'

export interface MucNote {
  kind: MucNoteKind
  text: string
}

// The notes that must stand beside one MUC so it is never read as more than it is.
export function mucNotes(muc: MaximumUseConcentration, unit: ConcentrationUnit, idlh: number | null): MucNote[] {
  const notes: MucNote[] = []
  if (unit === 'ppm' && muc.value > PURE_SUBSTANCE_PPM) {
    notes.push({
      kind: 'above-pure-substance',
      text: 'Above 1,000,000 ppm, the pure substance: not a usable limit. The IDLH, the lower explosive limit and the cartridge\'s limit govern.'
    })
  }
  if (idlh === null && !muc.cappedAtIdlh) {
    notes.push({ kind: 'no-idlh-cap', text: 'Not capped: no IDLH entered for this substance.' })
  }
  return notes
}
