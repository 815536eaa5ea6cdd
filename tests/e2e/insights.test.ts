import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Browser } from 'playwright-core'
import { DEMO_PASSWORD } from '../../scripts/seed/demo-accounts.mjs'
import { baseUrl, launch, screenshot, signInAs } from '../support/browser'

let browser: Browser
beforeAll(async () => {
  browser = await launch()
})
afterAll(async () => {
  await browser?.close()
})

describe('a hygienist reviews the program', () => {
  it('filters Insights to one model, finds the drifting person, opens their trend, and countersigns two results', async () => {
    const page = await browser.newPage({ viewport: { width: 1280, height: 1000 } })
    await signInAs(page, 'reviewer@tamsin-valley.example', DEMO_PASSWORD)
    await page.waitForURL(`${baseUrl}/`)
    await page.getByRole('link', { name: 'Insights' }).first().click()
    await page.waitForURL(`${baseUrl}/insights`)
    await page.getByRole('heading', { name: 'Which models fit this workforce' }).waitFor()
    await page.getByLabel('Respirator model').selectOption({ label: 'Corvid Safety CV-7 full facepiece' })
    await page.waitForURL(/respiratorModelId=/)
    const drift = page.locator('#drift')
    await drift.getByRole('link', { name: 'Maren Tollbrook' }).waitFor()
    await screenshot(page, 'insights-one-model')
    await drift.getByRole('button', { name: 'Table' }).click()
    await expect(drift.getByRole('table').textContent()).resolves.toContain('Maren Tollbrook')
    await drift.getByRole('button', { name: 'Chart' }).click()
    await drift.getByRole('link', { name: 'Maren Tollbrook' }).click()
    await page.waitForURL(/\/people\/[0-9a-f-]{36}/)
    const trend = page.locator('#fit-trend')
    await trend.getByText('Drifting.').waitFor()
    await screenshot(page, 'insights-person-trend')

    await page.goto(`${baseUrl}/reviews`)
    const heading = page.locator('#queue-heading')
    await heading.waitFor()
    const before = Number((await heading.textContent())!.match(/\d+/)![0])
    expect(before).toBeGreaterThan(2)
    for (let i = 0; i < 2; i++) {
      await page.getByRole('button', { name: 'Review', exact: true }).first().click()
      await page.getByLabel(/Comment or question about/).fill(i === 0 ? 'Counts and coverage checked.' : '')
      await page.getByRole('button', { name: 'Countersign' }).click()
      await page.getByRole('status').filter({ hasText: 'Countersigned the result of' }).waitFor()
      await expect.poll(async () => Number((await heading.textContent())!.match(/\d+/)![0])).toBe(before - i - 1)
    }
    await screenshot(page, 'review-queue')

    // A bad filter in the address is reset with a message, not silently read.
    await page.goto(`${baseUrl}/insights?from=last-year`)
    await page.getByRole('alert').filter({ hasText: 'could not be read' }).waitFor()
    await page.setViewportSize({ width: 360, height: 900 })
    await screenshot(page, 'insights-narrow')
    await page.close()
  })
})
