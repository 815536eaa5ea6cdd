/**
 * The bench components in the Nuxt environment: the grid, the series entry and the verdict panel,
 * mounted as the draft editor mounts them. Check values carry their source.
 */
import { describe, expect, it, vi } from 'vitest'
import { mountSuspended } from '@nuxt/test-utils/runtime'
import { STANDARD_PROTOCOL } from '#shared/utils/compute'
import { evaluateFitTest } from '#shared/utils/fit-test-evaluate'
import { fitTestEntrySchema } from '#shared/utils/fit-test-schemas'
import { useFitTestDraftStore } from '~/stores/fit-test-draft'
import FitTestGrid from '~/components/fit-test/FitTestGrid.vue'
import FitTestSeriesEntry from '~/components/fit-test/FitTestSeriesEntry.vue'
import FitTestVerdict from '~/components/fit-test/FitTestVerdict.vue'
import { allPreTestMet, standardEntry, syntheticSeries } from '../support/fit-test-inputs'

function draftOf(id: string, mode: 'grid' | 'series' = 'grid') {
  const entry = fitTestEntrySchema.parse({ ...standardEntry([1000, 1000, 1000, 1000, 1000, 1000, 10]), mode })
  return useFitTestDraftStore().load(id, { version: 1, entry, preTest: allPreTestMet, respiratorSize: 'M' }, null)
}
const resultOf = (entry: ReturnType<typeof standardEntry>) => evaluateFitTest({ protocol: STANDARD_PROTOCOL, entry: fitTestEntrySchema.parse(entry), passLevel: 100 }).result

describe('FitTestGrid', () => {
  it('shows each exercise\'s fit factor beside its readings and sends every keystroke to the draft', async () => {
    const draft = draftOf('grid-1')
    const result = resultOf(standardEntry([1000, 1000, 1000, 1000, 1000, 1000, 10]))
    const grid = await mountSuspended(FitTestGrid, { props: { draftId: 'grid-1', protocol: STANDARD_PROTOCOL, draft, result, decimalMark: 'point' } })
    // 10,000 / 10 = 1000 and 10,000 / 1000 = 10: 29 CFR 1910.134 App. A Part I.C.2 (ambient over in-mask).
    expect(grid.get('[data-testid="ff-deep-breathing"]').text()).toBe('1000')
    expect(grid.get('[data-testid="ff-normal-breathing-end"]').text()).toBe('10.0')
    const talking = grid.get('input[aria-label="In-mask for Talking"]')
    await talking.setValue('12,5')
    expect(useFitTestDraftStore().drafts['grid-1']!.cells.talking!.inMask).toBe('12,5')
    expect(useFitTestDraftStore().drafts['grid-1']!.dirty).toBe(true)
    expect(grid.emitted('changed')).toHaveLength(1)
  })

  it('names a refused cell beside it and never shows a number the reader did not read', async () => {
    const draft = draftOf('grid-2')
    const grid = await mountSuspended(FitTestGrid, { props: { draftId: 'grid-2', protocol: STANDARD_PROTOCOL, draft, result: null, decimalMark: 'point' } })
    await grid.get('input[aria-label="In-mask for Talking"]').setValue('-4')
    expect(grid.get('[data-testid="cell-refused"]').text()).toContain('In-mask for Talking: \'-4\' is negative')
    expect(grid.get('input[aria-label="In-mask for Talking"]').attributes('aria-invalid')).toBe('true')
    expect(grid.get('[data-testid="ff-talking"]').text()).toBe('—')
  })
})

describe('FitTestSeriesEntry', () => {
  it('keeps every paste in the draft at once and reads it after a pause, without leaving the box', async () => {
    vi.useFakeTimers()
    const draft = draftOf('series-1', 'series')
    const entry = await mountSuspended(FitTestSeriesEntry, { props: { draftId: 'series-1', protocol: STANDARD_PROTOCOL, draft, decimalMark: 'point', issues: [] } })
    const series = syntheticSeries(STANDARD_PROTOCOL, 8000, 400)
    await entry.get('textarea').setValue(series)
    expect(useFitTestDraftStore().drafts['series-1']!.seriesText).toBe(series)
    expect(entry.emitted('changed')).toHaveLength(1)
    await vi.advanceTimersByTimeAsync(300)
    // One reading a second over the whole protocol (derived from the synthetic series' own layout).
    expect(entry.get('[data-testid="series-count"]').text()).toBe(`${series.trim().split('\n').length - 1} readings read.`)
    vi.useRealTimers()
  })
})

describe('FitTestVerdict', () => {
  const pass = resultOf(standardEntry([1000, 1000, 1000, 1000, 1000, 1000, 1000]))
  const fail = resultOf(standardEntry([1000, 1000, 1000, 1000, 1000, 1000, 10]))

  it('never shows an uncovered pass as a plain pass: the flag sits beside the verdict', async () => {
    const coverage = { covered: false, reason: 'no-check-that-day' as const, message: 'No passing readiness check of counter 1 earlier that day.' }
    const panel = await mountSuspended(FitTestVerdict, { props: { result: pass, passLevel: 100, passLevelSource: '29 CFR 1910.134(f)(7)', coverage } })
    expect(panel.get('[data-testid="verdict-word"]').text()).toBe('PASS')
    expect(panel.get('[data-testid="verdict-coverage"]').text()).toContain('Not covered by a readiness check')
    expect(panel.get('[data-testid="pass-level-source"]').text()).toBe('29 CFR 1910.134(f)(7)')
    expect(panel.get('#verdict-spoken').text()).toBe('Pass, overall fit factor 1000 against pass level 100. Not covered by a readiness check.')
    expect(panel.text()).toContain(pass.cautions[0])
  })

  it('says a preview is not a result, and a failing overall fails', async () => {
    // [1000×6, 10] → 66.0: 29 CFR 1910.134 App. A Part I.C.2(c) harmonic mean (DOMAIN.md check value).
    const panel = await mountSuspended(FitTestVerdict, { props: { result: fail, passLevel: 100, preview: true } })
    expect(panel.text()).toContain('As typed — not saved as a result until finished')
    expect(panel.get('[data-testid="verdict-word"]').text()).toBe('FAIL')
    expect(panel.get('[data-testid="overall-fit-factor"]').text()).toBe('66.0')
  })
})
