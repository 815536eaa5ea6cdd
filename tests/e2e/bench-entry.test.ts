/**
 * The entry flows at the bench: focus after Start and Finish, the mode tabs by keyboard, a phone
 * at 360 px, and nothing typed or pasted lost to a reload or a dropped network.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Browser, BrowserContext, Page } from 'playwright-core'
import { DEMO_PASSWORD } from '../../scripts/seed/demo-accounts.mjs'
import { STANDARD_PROTOCOL } from '../../shared/utils/compute'
import { syntheticSeries } from '../support/fit-test-inputs'
import { baseUrl, launch, screenshot, signInAs } from '../support/browser'

let browser: Browser

beforeAll(async () => {
  browser = await launch()
})
afterAll(async () => {
  await browser?.close()
})

async function testerContext(width: number): Promise<{ context: BrowserContext, page: Page }> {
  const context = await browser.newContext({ viewport: { width, height: 900 } })
  const page = await context.newPage()
  await signInAs(page, 'tester@tamsin-valley.example', DEMO_PASSWORD)
  await page.waitForURL(`${baseUrl}/`)
  return { context, page }
}

/** Starts a standard-protocol test for the first person on the roster; returns with the draft open. */
async function startTest(page: Page) {
  await page.goto(`${baseUrl}/fit-tests/new`)
  await page.getByLabel('Person', { exact: true }).selectOption({ index: 1 })
  await page.getByLabel('Respirator', { exact: true }).selectOption({ label: 'Corvid Safety CV-2 half mask — Elastomeric half mask' })
  await page.getByLabel('Size', { exact: true }).selectOption('M')
  await page.getByLabel('Protocol', { exact: true }).selectOption({ label: 'Standard protocol' })
  for (const box of await page.getByRole('checkbox').all()) await box.check()
  await page.getByRole('button', { name: 'Start the test' }).click()
  await page.waitForURL(/\/fit-tests\/[0-9a-f-]{36}$/)
  await page.getByTestId('save-state').waitFor()
}

const focusedLabel = (page: Page) => page.evaluate(() => {
  const el = document.activeElement as HTMLElement | null
  return el ? `${el.tagName}:${el.getAttribute('aria-label') ?? el.dataset.testid ?? el.textContent?.trim().slice(0, 40)}` : ''
})

describe('entry by keyboard and screen reader', () => {
  it('moves focus to the test after Start, switches modes with arrow keys, and to the verdict after Finish', async () => {
    const { context, page } = await testerContext(1280)
    await startTest(page)
    // The first field of the new content: the first pre-test confirmation.
    await expect.poll(() => page.evaluate(() => (document.activeElement as HTMLInputElement | null)?.type)).toBe('checkbox')

    const gridTab = page.getByRole('tab', { name: 'Type per exercise' })
    await expect(gridTab.getAttribute('aria-selected')).resolves.toBe('true')
    await expect(page.getByRole('tab', { name: 'Paste a count series' }).getAttribute('tabindex')).resolves.toBe('-1')
    await gridTab.focus()
    await page.keyboard.press('ArrowRight')
    await expect(page.getByRole('tab', { name: 'Paste a count series' }).getAttribute('aria-selected')).resolves.toBe('true')
    await expect(focusedLabel(page)).resolves.toContain('Paste a count series')
    await expect(page.getByRole('tabpanel').getByLabel('Paste the readings').isVisible()).resolves.toBe(true)
    await page.keyboard.press('ArrowLeft')
    await expect(gridTab.getAttribute('aria-selected')).resolves.toBe('true')

    for (const e of STANDARD_PROTOCOL.exercises.filter(x => x.counted)) {
      await page.getByLabel(`Ambient before for ${e.name}`).fill('10000')
      await page.getByLabel(`Ambient after for ${e.name}`).fill('10000')
      await page.getByLabel(`In-mask for ${e.name}`).fill('20')
    }
    // 10,000 / 20 = 500 in every exercise: 29 CFR 1910.134 App. A Part I.C.2 (ratio of ambient to in-mask).
    await expect(page.getByTestId('overall-fit-factor').textContent()).resolves.toBe('500.0')
    await page.getByRole('button', { name: 'Finish and lock the record' }).click()
    await page.getByTestId('card-link').waitFor()
    await expect.poll(() => focusedLabel(page)).toBe('SECTION:verdict')
    await expect(page.getByTestId('verdict').getAttribute('aria-describedby').then(id => page.locator(`#${id}`).textContent())).resolves.toMatch(/^Pass, overall fit factor 500\.0 against pass level 100\. (Covered|Not covered)/)
    await context.close()
  })

  it('opens "Abandon this check…" on its field, closes on Escape and gives the focus back (on a 360 px phone)', async () => {
    const { context, page } = await testerContext(360)
    await page.goto(`${baseUrl}/equipment/checks`)
    await page.getByLabel('Equipment').selectOption({ index: 1 })
    await page.getByRole('button', { name: 'Start check' }).click()
    await page.waitForURL(/\/equipment\/checks\/[0-9a-f-]{36}$/)
    await page.getByTestId('runner-step').waitFor()
    await expect(page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth)).resolves.toBeLessThanOrEqual(0)
    await screenshot(page, 'readiness-runner-360')
    await page.getByRole('button', { name: 'Abandon this check…' }).click()
    await expect.poll(() => page.evaluate(() => document.activeElement?.id)).toBe('abandon-reason')
    await page.keyboard.press('Escape')
    await expect.poll(() => focusedLabel(page)).toBe('BUTTON:Abandon this check…')
    await page.getByRole('button', { name: 'Abandon this check…' }).click()
    await page.getByLabel('Why is the check abandoned?').fill('Counter battery flat, check moved to tomorrow')
    await page.getByRole('button', { name: 'Abandon check' }).click()
    await page.getByTestId('check-summary').waitFor()
    await context.close()
  })
})

describe('nothing typed is lost', () => {
  it('keeps a value typed just before a reload', async () => {
    const { context, page } = await testerContext(1280)
    await startTest(page)
    const cell = page.getByLabel('In-mask for Talking')
    await cell.fill('12.5')
    // Well inside the 0.7 s autosave pause: the page hides, and the keepalive save still arrives.
    await page.reload()
    await expect.poll(() => page.getByLabel('In-mask for Talking').inputValue()).toBe('12.5')
    // And the server holds it: a second reload (the tab's copy is gone once saved) shows it too.
    await page.getByTestId('save-state').filter({ hasText: 'Draft saved' }).waitFor()
    await expect.poll(() => page.evaluate(() => Object.keys(sessionStorage).filter(k => k.startsWith('sealwright-draft-')).length)).toBe(0)
    await page.reload()
    await expect.poll(() => page.getByLabel('In-mask for Talking').inputValue()).toBe('12.5')
    await context.close()
  })

  it('reads a pasted series as it is pasted, saves it with the draft and restores it on reload', async () => {
    const { context, page } = await testerContext(1280)
    await startTest(page)
    await page.getByRole('tab', { name: 'Paste a count series' }).click()
    const series = syntheticSeries(STANDARD_PROTOCOL, 8000, 400)
    const lines = series.trim().split('\n').length - 1
    await page.getByLabel('Paste the readings').fill(series)
    // Without leaving the box: the count follows the paste.
    await expect.poll(() => page.getByTestId('series-count').textContent()).toBe(`${lines} readings read.`)
    await page.getByTestId('save-state').filter({ hasText: 'Draft saved' }).waitFor()
    await page.reload()
    await expect(page.getByLabel('Paste the readings').inputValue()).resolves.toBe(series)
    await expect(page.getByRole('tab', { name: 'Paste a count series' }).getAttribute('aria-selected')).resolves.toBe('true')

    // Finished, the record keeps the series as recorded and offers it for download.
    await page.getByRole('button', { name: 'Finish and lock the record' }).click()
    await page.getByTestId('raw-series').waitFor()
    await page.getByRole('button', { name: 'Show the readings' }).click()
    await expect(page.getByTestId('raw-series-text').textContent()).resolves.toBe(series)
    const href = await page.getByTestId('raw-series-download').getAttribute('href')
    const download = await page.request.get(`${baseUrl}${href}`)
    expect(download.headers()['content-disposition']).toMatch(/^attachment; filename="count-series-revision-1\.txt"$/)
    expect(await download.text()).toBe(series)
    await context.close()
  })

  it('shows an offline banner while the network is gone and catches up when it returns', async () => {
    const { context, page } = await testerContext(1280)
    await startTest(page)
    await context.setOffline(true)
    await page.getByTestId('offline-banner').waitFor()
    await page.getByLabel('In-mask for Deep breathing').fill('7.5')
    await page.getByTestId('save-state').filter({ hasText: 'Offline' }).waitFor()
    await screenshot(page, 'fit-test-offline')
    await context.setOffline(false)
    await page.getByTestId('save-state').filter({ hasText: 'Draft saved' }).waitFor()
    await expect(page.getByTestId('offline-banner').count()).resolves.toBe(0)
    await page.reload()
    await expect(page.getByLabel('In-mask for Deep breathing').inputValue()).resolves.toBe('7.5')
    await context.close()
  })
})

describe('a phone at 360 px', () => {
  const overflow = (page: Page) => page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth)

  it('shows every exercise\'s fit factor and the verdict without sideways scrolling', async () => {
    const { context, page } = await testerContext(360)
    await startTest(page)
    for (const e of STANDARD_PROTOCOL.exercises.filter(x => x.counted)) {
      await page.getByLabel(`Ambient before for ${e.name}`).fill('10000')
      await page.getByLabel(`Ambient after for ${e.name}`).fill('10000')
      await page.getByLabel(`In-mask for ${e.name}`).fill('50')
    }
    await expect(overflow(page)).resolves.toBeLessThanOrEqual(0)
    for (const e of STANDARD_PROTOCOL.exercises.filter(x => x.counted)) {
      const box = await page.getByTestId(`ff-${e.key}`).boundingBox()
      expect(box!.x + box!.width).toBeLessThanOrEqual(360)
      await expect(page.getByTestId(`ff-${e.key}`).textContent()).resolves.toMatch(/^\s*200\.0\s*$/)
    }
    await screenshot(page, 'fit-test-grid-360')
    await page.getByRole('tab', { name: 'Paste a count series' }).click()
    await expect(overflow(page)).resolves.toBeLessThanOrEqual(0)
    await page.goto(`${baseUrl}/equipment/headform`)
    await page.getByRole('heading', { name: 'Headform test' }).waitFor()
    await expect(overflow(page)).resolves.toBeLessThanOrEqual(0)
    await screenshot(page, 'headform-entry-360')
    await context.close()
  })
})
