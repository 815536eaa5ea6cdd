import { readFileSync } from 'node:fs'
import { describe, expect, it } from 'vitest'
import { renderFitCardPdf } from '../../server/utils/fit-card'
import type { FitCardContent } from '../../server/utils/fit-card'
import { FIT_TEST_CAUTIONS } from '../../shared/utils/compute'

// The fit card is one A6 landscape page whatever its text (issue 8, item 8). Names and models
// are invented test data.

const dir = 'node_modules/@fontsource/ibm-plex-sans/files/'
const fonts = () => ({ regular: readFileSync(`${dir}ibm-plex-sans-latin-400-normal.woff`), bold: readFileSync(`${dir}ibm-plex-sans-latin-600-normal.woff`) })
const pages = (pdf: Buffer) => (pdf.toString('latin1').match(/\/Type \/Page\b/g) ?? []).length

function card(over: Partial<FitCardContent> = {}): FitCardContent {
  return {
    organization: 'Fixture Waterworks',
    fields: [['Wearer', 'Rowan Testwell'], ['Respirator', 'Fixture Safety FX-2 half mask'], ['Style and size', 'Elastomeric half mask, size M'], ['Test', 'Quantitative — Standard protocol'], ['Overall fit factor', '100.0 (pass level 100)'], ['Tested on', '20 Nov 2026'], ['Next due', '20 Nov 2027'], ['Tester', 'Fixture Tester']],
    coverage: 'covered',
    citation: 'Fit tested under 29 CFR 1910.134(f) and Appendix A; pass level: 29 CFR 1910.134(f)(7). Record kept under 29 CFR 1910.134(m)(2).',
    cautions: FIT_TEST_CAUTIONS,
    link: 'http://127.0.0.1:3000/verify/abcdefghijklmnopqrstuvwxyz0123456789ABCD',
    title: 'Fit card',
    ...over
  }
}

describe('the fit card layout', () => {
  it('is one A6 landscape page', async () => {
    const pdf = await renderFitCardPdf(card(), fonts())
    expect(pages(pdf)).toBe(1)
    // A6 is 105 × 148 mm = 297.64 × 419.53 pt (ISO 216); landscape puts the long side across.
    expect(pdf.toString('latin1')).toMatch(/\/MediaBox \[0 0 419\.53 297\.64\]/)
  }, 60_000)

  it('stays one page with very long text, a mask unit and an uncovered flag', async () => {
    const long = 'Very long text '.repeat(30)
    const pdf = await renderFitCardPdf(card({
      organization: long,
      fields: [['Wearer', long], ['Respirator', long], ['Style and size', long], ['Mask unit', long], ['Test', long], ['Overall fit factor', long], ['Tested on', long], ['Next due', long], ['Tester', long]],
      coverage: 'not-covered',
      citation: long,
      cautions: [long, long, long, long],
      link: `http://127.0.0.1:3000/verify/${'x'.repeat(200)}`
    }), fonts())
    expect(pages(pdf)).toBe(1)
  }, 60_000)
})
