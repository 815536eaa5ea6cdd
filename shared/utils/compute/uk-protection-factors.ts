// Assigned protection factors under UK practice — HSE HSG53, "Respiratory protective equipment at
// work". FFP1 4, FFP2 10 and FFP3 20 are confirmed by secondary summaries; every other value here
// is from memory and is labelled so wherever it is shown. Classes HSG53 values are not held for
// show none rather than a guess. Keyed by the respirator classes of respirator-classes.ts.

export interface UkProtectionFactor {
  // One value, or one per filter grade ("FFP1 4 · FFP2 10 · FFP3 20")
  values: readonly { grade?: string, apf: number }[]
  fromMemory: boolean
  source: string
}

const CONFIRMED = 'HSE HSG53, via secondary summaries'
const FROM_MEMORY = 'HSE HSG53 (value from memory)'

export const UK_PROTECTION_FACTORS: Readonly<Record<string, UkProtectionFactor>> = {
  'filtering-facepiece': { values: [{ grade: 'FFP1', apf: 4 }, { grade: 'FFP2', apf: 10 }, { grade: 'FFP3', apf: 20 }], fromMemory: false, source: CONFIRMED },
  'elastomeric-half-mask': { values: [{ grade: 'P3 filter', apf: 20 }], fromMemory: true, source: FROM_MEMORY },
  'elastomeric-full-facepiece': { values: [{ grade: 'P3 filter', apf: 40 }], fromMemory: true, source: FROM_MEMORY },
  'papr-helmet-hood': { values: [{ grade: 'TH3', apf: 40 }], fromMemory: true, source: FROM_MEMORY },
  'papr-full-facepiece': { values: [{ grade: 'TM3', apf: 40 }], fromMemory: true, source: FROM_MEMORY },
  'scba-pressure-demand-full-facepiece': { values: [{ apf: 2000 }], fromMemory: true, source: FROM_MEMORY }
}

export function ukProtectionFactor(respiratorClassKey: string): UkProtectionFactor | null {
  return UK_PROTECTION_FACTORS[respiratorClassKey] ?? null
}

// "FFP1 4 · FFP2 10 · FFP3 20", "40 (TM3)", "2000".
export function describeUkProtectionFactor(factor: UkProtectionFactor): string {
  if (factor.values.length > 1) return factor.values.map(v => `${v.grade} ${v.apf}`).join(' · ')
  const [only] = factor.values
  return only!.grade ? `${only!.apf} (${only!.grade})` : String(only!.apf)
}
