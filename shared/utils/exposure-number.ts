import { readTypedNumber } from './number-reader'
import type { DecimalMark } from './number-reader'

// Every number typed into the protection calculator passes through this one function, which
// defers to the organization's shared number reader.

export type ReadNumber = { ok: true, value: number | null, asRead: string, differs: boolean } | { ok: false, message: string }

export function readCalculatorNumber(text: string, decimalMark: DecimalMark = 'point'): ReadNumber {
  const r = readTypedNumber(text, { decimalMark })
  if (r.ok) return { ok: true, value: r.value, asRead: r.asRead, differs: r.differs }
  if (r.empty) return { ok: true, value: null, asRead: '', differs: false }
  return { ok: false, message: r.message }
}
