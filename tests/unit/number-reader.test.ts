import { describe, expect, it } from 'vitest'
import fc from 'fast-check'
import { formatTypedNumber, readTypedNumber } from '#shared/utils/number-reader'
import type { DecimalMark } from '#shared/utils/number-reader'

// The reading rules are Sealwright's own (DOMAIN.md "Typing numbers"); the rows are cases a fit
// tester types, chosen from common practice (no published source).
describe('readTypedNumber reads what a person typed, or refuses it with a reason', () => {
  it.each<[string, DecimalMark, number, string]>([
    ['10,000', 'point', 10000, 'comma in groups of three is a thousands separator (common practice)'],
    ['1,234', 'point', 1234, 'an in-mask 1,234 /cm³ is one thousand two hundred thirty-four, not 1.234'],
    ['12,500', 'point', 12500, 'ambient concentration with a thousands separator'],
    ['1,234.5', 'point', 1234.5, 'thousands separator and decimal point'],
    ['1.234,5', 'comma', 1234.5, 'comma mode: point groups, comma decimal'],
    ['12,5', 'comma', 12.5, 'comma mode decimal'],
    ['1e3', 'point', 1000, 'scientific notation'],
    ['1.2E+03', 'point', 1200, 'scientific notation with a signed exponent'],
    ['1,2E+03', 'comma', 1200, 'scientific notation in comma mode'],
    [' 42 ', 'point', 42, 'spaces around the number'],
    ['−3', 'point', -3, 'Unicode minus sign'],
    ['1 000', 'point', 1000, 'space as digit group separator'],
    ['1\u2009000', 'point', 1000, 'thin space as digit group separator'],
    ['25 000,5', 'comma', 25000.5, 'space groups in comma mode'],
    ['.5', 'point', 0.5, 'no leading zero'],
    ['12.', 'point', 12, 'half-typed decimal'],
    ['0', 'point', 0, 'a zero count']
  ])('%s (%s) reads %d — %s', (text, mark, value) => {
    const reading = readTypedNumber(text, { decimalMark: mark })
    expect(reading.ok).toBe(true)
    if (reading.ok) expect(reading.value).toBe(value)
  })

  it.each<[string, DecimalMark, RegExp, string]>([
    ['1,5', 'point', /ambiguous: write 1\.5 or 15/, 'a comma not grouping three digits'],
    ['1,23', 'point', /ambiguous: write 1\.23 or 123/, 'two digits after the comma'],
    ['0,500', 'point', /ambiguous/, 'a leading zero group is a decimal written with a comma'],
    ['1.5', 'comma', /ambiguous: write 1,5 or 15/, 'mirror image in comma mode'],
    ['1.234,5', 'point', /after the decimal point/, 'comma-mode text in point mode'],
    ['0x10', 'point', /hexadecimal/, 'hex'],
    ['Infinity', 'point', /not a number/, 'infinity'],
    ['NaN', 'point', /not a number/, 'NaN'],
    ['12%', 'point', /percent/, 'percent sign'],
    ['1200 /cm3', 'point', /without units/, 'units in the cell'],
    ['12 5', 'point', /threes/, 'a space that does not group three digits'],
    ['1.2.3', 'point', /more than one decimal/, 'two decimal points'],
    ['1e400', 'point', /too large/, 'overflows to infinity'],
    ['-', 'point', /not a number we can read/, 'a sign alone']
  ])('refuses %s (%s) — %s', (text, mark, message) => {
    const reading = readTypedNumber(text, { decimalMark: mark })
    expect(reading.ok).toBe(false)
    if (!reading.ok) {
      expect(reading.empty).toBe(false)
      expect(reading.message).toMatch(message)
    }
  })

  it('treats an empty cell as empty, not as zero', () => {
    const reading = readTypedNumber('  ')
    expect(reading).toMatchObject({ ok: false, empty: true })
  })

  it('says when the value as read differs from the text, so the preview can show it', () => {
    expect(readTypedNumber('12,500')).toMatchObject({ ok: true, asRead: '12 500', differs: true })
    expect(readTypedNumber('42')).toMatchObject({ ok: true, asRead: '42', differs: false })
    expect(readTypedNumber('12,5', { decimalMark: 'comma' })).toMatchObject({ ok: true, differs: false })
  })

  it.each<DecimalMark>(['point', 'comma'])('formatting a number and reading it back is the identity (%s)', (mark) => {
    fc.assert(fc.property(fc.double({ noNaN: true, noDefaultInfinity: true }), (value) => {
      const reading = readTypedNumber(formatTypedNumber(value, mark), { decimalMark: mark })
      expect(reading.ok).toBe(true)
      if (reading.ok) expect(reading.value).toBe(value === 0 ? 0 : value)
    }), { numRuns: 2000 })
  })
})
