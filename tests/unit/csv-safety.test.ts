import { describe, expect, it } from 'vitest'
import { neutraliseCsvCell, neutraliseCsvRows } from '#shared/utils/csv-safety'

describe('cells a spreadsheet would run as a formula', () => {
  // Characters that start a formula: common practice (no published source).
  it.each([
    ['=HYPERLINK("http://x.example","y")', '\'=HYPERLINK("http://x.example","y")'],
    ['+1+2', '\'+1+2'],
    ['-2+3', '\'-2+3'],
    ['@SUM(A1)', '\'@SUM(A1)'],
    ['\t=1', '\'\t=1'],
    ['\r=1', '\'\r=1'],
    ['=1\n2', '\'=1\n2'],
    ['Ada Example', 'Ada Example'],
    ['>1234.5', '>1234.5'],
    ['', '']
  ])('%j → %j', (input, expected) => {
    expect(neutraliseCsvCell(input)).toBe(expected)
  })

  it('leaves numbers as numbers and empties what is missing', () => {
    expect(neutraliseCsvCell(66.04)).toBe(66.04)
    expect(neutraliseCsvCell(null)).toBe('')
    expect(neutraliseCsvCell(undefined)).toBe('')
    expect(neutraliseCsvCell(Number.NaN)).toBe('')
    expect(neutraliseCsvRows([{ a: '=1', b: 2 }])).toEqual([{ a: '\'=1', b: 2 }])
  })
})
