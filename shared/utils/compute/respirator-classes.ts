import { SOURCE_FROM_MEMORY } from './sources'

// Respirator classes of 29 CFR 1910.134(d)(3)(i)(A), Table 1 (assigned protection factors),
// each with the fit category that picks its pass level and the APF used for selection.

// Which pass level a tight-fitting facepiece is tested against: 29 CFR 1910.134(f)(7) names
// tight-fitting half facepieces and tight-fitting full facepieces.
export type FitCategory = 'half' | 'full'

export type RespiratorFamily = 'air-purifying' | 'powered-air-purifying' | 'supplied-air' | 'self-contained'

export type FacepieceKind
  = | 'filtering-facepiece'
    | 'quarter-mask'
    | 'half-mask'
    | 'full-facepiece'
    | 'helmet-hood'
    | 'loose-fitting-facepiece'

export interface RespiratorClass {
  key: string
  label: string
  family: RespiratorFamily
  facepiece: FacepieceKind
  tightFitting: boolean
  // null: loose-fitting, not fit tested (29 CFR 1910.134(f) covers tight-fitting facepieces, from memory).
  fitCategory: FitCategory | null
  apf: number
  apfSource: string
  // Air-purifying classes clean the room's air and are never adequate in an IDLH atmosphere.
  airPurifying: boolean
  // Accepted for IDLH atmospheres by 29 CFR 1910.134(d)(2)(i)(A) (from memory).
  idlhCapable: boolean
  note?: string
}

export const FIT_CATEGORY_LABELS: Readonly<Record<FitCategory, string>> = {
  half: 'Half facepiece (filtering or elastomeric)',
  full: 'Full facepiece'
}

const TABLE = '29 CFR 1910.134(d)(3)(i)(A), Table 1'
const TABLE_FROM_MEMORY = `${TABLE} (value ${SOURCE_FROM_MEMORY})`

export const RESPIRATOR_CLASSES: readonly RespiratorClass[] = [
  {
    key: 'filtering-facepiece', label: 'Filtering facepiece (disposable half mask)',
    family: 'air-purifying', facepiece: 'filtering-facepiece', tightFitting: true, fitCategory: 'half',
    apf: 10, apfSource: `${TABLE}, half mask (the table's note places filtering facepieces here, ${SOURCE_FROM_MEMORY})`,
    airPurifying: true, idlhCapable: false
  },
  {
    key: 'elastomeric-quarter-mask', label: 'Elastomeric quarter mask',
    family: 'air-purifying', facepiece: 'quarter-mask', tightFitting: true, fitCategory: 'half',
    apf: 5, apfSource: TABLE_FROM_MEMORY,
    airPurifying: true, idlhCapable: false,
    note: 'Tested against the half facepiece pass level (our reading of 29 CFR 1910.134(f)(7))'
  },
  {
    key: 'elastomeric-half-mask', label: 'Elastomeric half mask',
    family: 'air-purifying', facepiece: 'half-mask', tightFitting: true, fitCategory: 'half',
    apf: 10, apfSource: `${TABLE}, half mask`,
    airPurifying: true, idlhCapable: false
  },
  {
    key: 'elastomeric-full-facepiece', label: 'Elastomeric full facepiece (air-purifying)',
    family: 'air-purifying', facepiece: 'full-facepiece', tightFitting: true, fitCategory: 'full',
    apf: 50, apfSource: `${TABLE}, full facepiece air-purifying`,
    airPurifying: true, idlhCapable: false
  },
  {
    key: 'papr-half-mask', label: 'Powered air-purifying, tight-fitting half mask',
    family: 'powered-air-purifying', facepiece: 'half-mask', tightFitting: true, fitCategory: 'half',
    apf: 50, apfSource: TABLE_FROM_MEMORY,
    airPurifying: true, idlhCapable: false,
    note: 'Fit tested in negative-pressure mode (29 CFR 1910.134(f)(8), from memory)'
  },
  {
    key: 'papr-full-facepiece', label: 'Powered air-purifying, tight-fitting full facepiece',
    family: 'powered-air-purifying', facepiece: 'full-facepiece', tightFitting: true, fitCategory: 'full',
    apf: 1000, apfSource: `${TABLE}, powered air-purifying full facepiece`,
    airPurifying: true, idlhCapable: false,
    note: 'Fit tested in negative-pressure mode (29 CFR 1910.134(f)(8), from memory)'
  },
  {
    key: 'papr-helmet-hood', label: 'Powered air-purifying, helmet or hood',
    family: 'powered-air-purifying', facepiece: 'helmet-hood', tightFitting: false, fitCategory: null,
    apf: 25, apfSource: TABLE_FROM_MEMORY,
    airPurifying: true, idlhCapable: false,
    note: `1000 only with the maker's evidence of testing at that level (table note, ${SOURCE_FROM_MEMORY})`
  },
  {
    key: 'papr-loose-fitting-facepiece', label: 'Powered air-purifying, loose-fitting facepiece',
    family: 'powered-air-purifying', facepiece: 'loose-fitting-facepiece', tightFitting: false, fitCategory: null,
    apf: 25, apfSource: TABLE_FROM_MEMORY,
    airPurifying: true, idlhCapable: false
  },
  {
    key: 'supplied-air-demand-half-mask', label: 'Supplied-air, demand mode, half mask',
    family: 'supplied-air', facepiece: 'half-mask', tightFitting: true, fitCategory: 'half',
    apf: 10, apfSource: TABLE_FROM_MEMORY,
    airPurifying: false, idlhCapable: false
  },
  {
    key: 'supplied-air-demand-full-facepiece', label: 'Supplied-air, demand mode, full facepiece',
    family: 'supplied-air', facepiece: 'full-facepiece', tightFitting: true, fitCategory: 'full',
    apf: 50, apfSource: TABLE_FROM_MEMORY,
    airPurifying: false, idlhCapable: false
  },
  {
    key: 'supplied-air-continuous-half-mask', label: 'Supplied-air, continuous flow, half mask',
    family: 'supplied-air', facepiece: 'half-mask', tightFitting: true, fitCategory: 'half',
    apf: 50, apfSource: TABLE_FROM_MEMORY,
    airPurifying: false, idlhCapable: false
  },
  {
    key: 'supplied-air-continuous-full-facepiece', label: 'Supplied-air, continuous flow, full facepiece',
    family: 'supplied-air', facepiece: 'full-facepiece', tightFitting: true, fitCategory: 'full',
    apf: 1000, apfSource: TABLE_FROM_MEMORY,
    airPurifying: false, idlhCapable: false
  },
  {
    key: 'supplied-air-continuous-helmet-hood', label: 'Supplied-air, continuous flow, helmet or hood',
    family: 'supplied-air', facepiece: 'helmet-hood', tightFitting: false, fitCategory: null,
    apf: 25, apfSource: TABLE_FROM_MEMORY,
    airPurifying: false, idlhCapable: false,
    note: `1000 only with the maker's evidence of testing at that level (table note, ${SOURCE_FROM_MEMORY})`
  },
  {
    key: 'supplied-air-continuous-loose-fitting', label: 'Supplied-air, continuous flow, loose-fitting facepiece',
    family: 'supplied-air', facepiece: 'loose-fitting-facepiece', tightFitting: false, fitCategory: null,
    apf: 25, apfSource: TABLE_FROM_MEMORY,
    airPurifying: false, idlhCapable: false
  },
  {
    key: 'supplied-air-pressure-demand-half-mask', label: 'Supplied-air, pressure-demand, half mask',
    family: 'supplied-air', facepiece: 'half-mask', tightFitting: true, fitCategory: 'half',
    apf: 50, apfSource: TABLE_FROM_MEMORY,
    airPurifying: false, idlhCapable: false
  },
  {
    key: 'supplied-air-pressure-demand-full-facepiece', label: 'Supplied-air, pressure-demand, full facepiece',
    family: 'supplied-air', facepiece: 'full-facepiece', tightFitting: true, fitCategory: 'full',
    apf: 1000, apfSource: TABLE_FROM_MEMORY,
    airPurifying: false, idlhCapable: false,
    note: 'Adequate for IDLH only combined with an auxiliary self-contained air supply (29 CFR 1910.134(d)(2)(i)(B), from memory)'
  },
  {
    key: 'scba-demand-half-mask', label: 'Self-contained breathing apparatus, demand mode, half mask',
    family: 'self-contained', facepiece: 'half-mask', tightFitting: true, fitCategory: 'half',
    apf: 10, apfSource: TABLE_FROM_MEMORY,
    airPurifying: false, idlhCapable: false
  },
  {
    key: 'scba-demand-full-facepiece', label: 'Self-contained breathing apparatus, demand mode, full facepiece',
    family: 'self-contained', facepiece: 'full-facepiece', tightFitting: true, fitCategory: 'full',
    apf: 50, apfSource: TABLE_FROM_MEMORY,
    airPurifying: false, idlhCapable: false
  },
  {
    key: 'scba-demand-helmet-hood', label: 'Self-contained breathing apparatus, demand mode, helmet or hood',
    family: 'self-contained', facepiece: 'helmet-hood', tightFitting: false, fitCategory: null,
    apf: 50, apfSource: TABLE_FROM_MEMORY,
    airPurifying: false, idlhCapable: false
  },
  {
    key: 'scba-pressure-demand-full-facepiece', label: 'Self-contained breathing apparatus, pressure-demand, full facepiece',
    family: 'self-contained', facepiece: 'full-facepiece', tightFitting: true, fitCategory: 'full',
    apf: 10000, apfSource: `${TABLE}, pressure-demand self-contained breathing apparatus`,
    airPurifying: false, idlhCapable: true
  },
  {
    key: 'scba-pressure-demand-helmet-hood', label: 'Self-contained breathing apparatus, pressure-demand, helmet or hood',
    family: 'self-contained', facepiece: 'helmet-hood', tightFitting: false, fitCategory: null,
    apf: 10000, apfSource: TABLE_FROM_MEMORY,
    airPurifying: false, idlhCapable: false
  }
]

const byKey = new Map(RESPIRATOR_CLASSES.map(c => [c.key, c]))

export function findRespiratorClass(key: string): RespiratorClass | undefined {
  return byKey.get(key)
}
