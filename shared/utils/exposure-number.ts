// Every number typed into the protection calculator passes through this one function, so the
// organization's shared number reader can replace it with a one-line change.

export type ReadNumber = { ok: true, value: number | null, asRead: string } | { ok: false, message: string }

// Point as the decimal mark; spaces group digits; a comma only in thousands groups ("12,500").
export function readCalculatorNumber(text: string): ReadNumber {
  const trimmed = text.trim()
  if (trimmed === '') return { ok: true, value: null, asRead: '' }
  const compact = trimmed.replace(/\s+/g, '')
  if (/,/.test(compact) && !/^[+-]?\d{1,3}(,\d{3})+(\.\d+)?$/.test(compact)) {
    return { ok: false, message: `"${trimmed}" is ambiguous: write decimals with a point (1.5) and thousands as 12,500 or 12 500.` }
  }
  const plain = compact.replace(/,/g, '')
  if (!/^[+-]?(\d+\.?\d*|\.\d+)(e[+-]?\d+)?$/i.test(plain)) {
    return { ok: false, message: `"${trimmed}" is not a number: use digits with a point for decimals, without units.` }
  }
  const value = Number(plain)
  if (!Number.isFinite(value)) return { ok: false, message: `"${trimmed}" is too large.` }
  return { ok: true, value, asRead: String(value) }
}
