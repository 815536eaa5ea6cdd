import type { FitFactorValue } from './fit-factor'

// Digits shown by default: more for small factors, none from 1000 up.
function defaultDecimals(value: number): number {
  if (value < 10) return 2
  if (value < 1000) return 1
  return 0
}

// Text for a fit factor: "66.0", "> 2074". Digits are cut, not rounded, so a value just under a
// pass level never reads as the level, and a lower bound stays a true statement.
export function formatFitFactor(fitFactor: FitFactorValue | number, decimals?: number): string {
  const ff = typeof fitFactor === 'number' ? { value: fitFactor, isLowerBound: false } : fitFactor
  if (!Number.isFinite(ff.value)) return '—'
  const digits = decimals ?? defaultDecimals(ff.value)
  const scale = 10 ** digits
  // The small epsilon keeps 66.3 from becoming 66.29999 when cut.
  const cut = Math.floor(ff.value * scale * (1 + 1e-12)) / scale
  const text = cut.toFixed(digits)
  return ff.isLowerBound ? `> ${text}` : text
}
