import type { ConcentrationUnit } from './compute/exposure'
import type { LimitKind, SubstanceForm } from './compute/exposure-assessment'
import { readCalculatorNumber } from './exposure-number'
import { plainTypedNumber } from './number-reader'
import type { DecimalMark } from './number-reader'
import type { AssessmentStoredInput } from './exposure-schemas'

// The calculator form as typed (every number as text), and its reading into the stored input.
// A number that cannot be read gets a message on its field; a number read differently from how
// it was typed is listed so the page can show the value as read. Text is read with the
// organization's decimal mark, so "0,5" is a half where the mark is a comma and refused where it
// is a point (never silently read as 5).

export interface SegmentDraft {
  concentration: string
  hours: string
}

export interface SubstanceDraft {
  name: string
  form: SubstanceForm
  molecularWeight: string
  mode: 'single' | 'segments'
  exposure: string
  exposureUnit: ConcentrationUnit
  segments: SegmentDraft[]
  limit: string
  limitUnit: ConcentrationUnit
  limitKind: LimitKind
  limitSource: string
  idlh: string
}

export interface CalculatorDraft {
  contaminants: SubstanceDraft[]
  additiveMixture: boolean
  oxygenDeficient: boolean
}

export function emptySubstance(): SubstanceDraft {
  return {
    name: '', form: 'gas-vapour', molecularWeight: '', mode: 'single', exposure: '', exposureUnit: 'ppm',
    segments: [{ concentration: '', hours: '' }], limit: '', limitUnit: 'ppm', limitKind: 'twa-8h', limitSource: '', idlh: ''
  }
}

export interface ReadDraft {
  input: AssessmentStoredInput
  // field path (as the computation module names fields) → message
  readErrors: Record<string, string>
  // field path → the value as read, where it differs from the text
  asRead: Record<string, string>
}

export function readCalculatorDraft(draft: CalculatorDraft, decimalMark: DecimalMark = 'point'): ReadDraft {
  const readErrors: Record<string, string> = {}
  const asRead: Record<string, string> = {}
  const read = (text: string, field: string): number | null => {
    const r = readCalculatorNumber(text, decimalMark)
    if (!r.ok) {
      readErrors[field] = r.message
      return null
    }
    if (r.value !== null && r.differs) asRead[field] = r.asRead
    return r.value
  }
  const contaminants = draft.contaminants.map((s, i) => {
    const at = `contaminants.${i}`
    return {
      name: s.name.trim(),
      form: s.form,
      molecularWeight: read(s.molecularWeight, `${at}.molecularWeight`),
      exposure: s.mode === 'single'
        ? { mode: 'single' as const, value: read(s.exposure, `${at}.exposure.value`), unit: s.exposureUnit }
        : {
            mode: 'segments' as const,
            unit: s.exposureUnit,
            segments: s.segments.map((g, j) => ({
              concentration: read(g.concentration, `${at}.exposure.segments.${j}.concentration`) as number,
              hours: read(g.hours, `${at}.exposure.segments.${j}.hours`) as number
            }))
          },
      limit: { value: read(s.limit, `${at}.limit.value`), unit: s.limitUnit, kind: s.limitKind, source: s.limitSource.trim() },
      idlh: read(s.idlh, `${at}.idlh`)
    }
  })
  return { input: { contaminants, additiveMixture: draft.additiveMixture, oxygenDeficient: draft.oxygenDeficient }, readErrors, asRead }
}

// A stored input back into the form, for editing a draft or starting from a saved assessment,
// written with the organization's decimal mark so it reads back as the same numbers.
export function draftFromInput(input: AssessmentStoredInput, decimalMark: DecimalMark = 'point'): CalculatorDraft {
  const text = (v: number | null | undefined) => v === null || v === undefined ? '' : plainTypedNumber(v, decimalMark)
  return {
    additiveMixture: input.additiveMixture,
    oxygenDeficient: input.oxygenDeficient,
    contaminants: input.contaminants.map(c => ({
      name: c.name,
      form: c.form,
      molecularWeight: text(c.molecularWeight),
      mode: c.exposure.mode,
      exposure: c.exposure.mode === 'single' ? text(c.exposure.value) : '',
      exposureUnit: c.exposure.unit,
      segments: c.exposure.mode === 'segments' ? c.exposure.segments.map(g => ({ concentration: text(g.concentration), hours: text(g.hours) })) : [{ concentration: '', hours: '' }],
      limit: text(c.limit.value),
      limitUnit: c.limit.unit,
      limitKind: c.limit.kind,
      limitSource: c.limit.source,
      idlh: text(c.idlh)
    }))
  }
}
