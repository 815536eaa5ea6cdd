/**
 * The insights panel frame in the Nuxt environment: the heading, the table view beside the chart,
 * the named downloads, and the honest empty, loading and error states.
 */
import { describe, expect, it } from 'vitest'
import { h } from 'vue'
import { mountSuspended } from '@nuxt/test-utils/runtime'
import InsightsPanel from '~/components/insights/InsightsPanel.vue'

const frame = {
  id: 'demo-panel',
  title: 'How often the seal held',
  description: 'Invented numbers for the frame (demo data).',
  csv: { fileName: 'demo-panel.csv', headers: ['period', 'passed'], rows: [['2026-01', 3]] },
  empty: false,
  emptyText: 'Nothing matches these filters.',
  caption: 'Passes by period'
}
const slots = {
  chart: () => h('canvas', { 'data-testid': 'demo-chart' }),
  table: () => [h('thead', [h('tr', [h('th', 'Period'), h('th', 'Passed')])]), h('tbody', [h('tr', [h('td', '2026-01'), h('td', '3')])])]
}
const buttonNames = (w: { findAll: (selector: 'button') => { text: () => string }[] }) => w.findAll('button').map(b => b.text())

describe('InsightsPanel', () => {
  it('titles the panel, offers chart and table views and names both downloads', async () => {
    const panel = await mountSuspended(InsightsPanel, { props: frame, slots })
    expect(panel.get('h2').text()).toBe('How often the seal held')
    expect(panel.get('section').attributes('aria-labelledby')).toBe('demo-panel-heading')
    expect(panel.get('[role="group"]').attributes('aria-label')).toBe('How often the seal held: view and downloads')
    expect(buttonNames(panel)).toEqual(['Chart', 'Table', 'CSV', 'PNG'])
    // The table is in the page even while the chart shows, for screen readers and print.
    expect(panel.get('table caption').text()).toBe('Passes by period')
    expect(panel.get('table').text()).toContain('2026-01')
    expect(panel.find('[data-testid="demo-chart"]').exists()).toBe(true)
  })

  it('shows the table as a labelled scroll region when asked, and drops the PNG download there', async () => {
    const panel = await mountSuspended(InsightsPanel, { props: frame, slots })
    await panel.findAll('button').find(b => b.text() === 'Table')!.trigger('click')
    const region = panel.get('[role="region"]')
    expect(region.attributes('aria-label')).toBe('How often the seal held: table')
    expect(region.find('table').exists()).toBe(true)
    expect(buttonNames(panel)).toEqual(['Chart', 'Table', 'CSV'])
    expect(panel.get('button[aria-pressed="true"]').text()).toBe('Table')
  })

  it('says why there is nothing to show, and offers no download of nothing', async () => {
    const empty = await mountSuspended(InsightsPanel, { props: { ...frame, empty: true }, slots })
    expect(empty.get('.notice-caution').text()).toBe('Nothing matches these filters.')
    expect(empty.findAll('button')).toHaveLength(0)
    const failed = await mountSuspended(InsightsPanel, { props: { ...frame, error: 'The insights could not be loaded.' }, slots })
    expect(failed.get('[role="alert"]').text()).toBe('The insights could not be loaded.')
    expect(failed.find('table').exists()).toBe(false)
    const loading = await mountSuspended(InsightsPanel, { props: { ...frame, empty: true, pending: true }, slots })
    expect(loading.get('[role="status"]').text()).toBe('Working out this panel…')
  })
})
