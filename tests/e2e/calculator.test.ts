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

describe('a hygienist goes from measured exposure to the people not protected for the job', () => {
  it('computes the published examples as typed and refuses what it cannot read', async () => {
    const page = await browser.newPage({ viewport: { width: 1280, height: 1000 } })
    await signInAs(page, 'reviewer@tamsin-valley.example', DEMO_PASSWORD)
    await page.waitForURL(`${baseUrl}/`)
    await page.getByRole('link', { name: 'Protection calculator' }).first().click()
    await page.waitForURL(`${baseUrl}/calculator`)
    await page.locator('#calc-0-name').fill('Solvent A')
    await page.getByLabel('Time segments (8-hour TWA)').check()
    // 29 CFR 1910.1000(d)(1)(i), its own example: 2 h at 150, 2 h at 75, 4 h at 50 → 81.25 ppm.
    await page.locator('#calc-0-seg-0-c').fill('150')
    await page.locator('#calc-0-seg-0-h').fill('2')
    await page.getByRole('button', { name: 'Add a segment' }).click()
    await page.locator('#calc-0-seg-1-c').fill('75')
    await page.locator('#calc-0-seg-1-h').fill('2')
    await page.locator('#calc-0-limit').fill('100')
    await expect.poll(() => page.getByTestId('calculator-waiting').isVisible()).toBe(true)
    await expect.poll(() => page.getByText('missing 4 h would count as clean air').isVisible()).toBe(true)
    await page.getByRole('button', { name: 'Add a segment' }).click()
    await page.locator('#calc-0-seg-2-c').fill('50')
    await page.locator('#calc-0-seg-2-h').fill('4')
    // 81.25 / 100, shown to three figures rounded up.
    await expect.poll(() => page.getByTestId('hazard-ratio').textContent()).toBe('0.813')
    await page.locator('#calc-0-limit').fill('1,5')
    await expect.poll(() => page.getByText('\'1,5\' is ambiguous').isVisible()).toBe(true)
    await screenshot(page, 'calculator-bad-input')
  })

  it('enters a two-substance mixture, picks a class, signs off, assigns a job title and sees a gap', async () => {
    const page = await browser.newPage({ viewport: { width: 1280, height: 1000 } })
    await signInAs(page, 'reviewer@tamsin-valley.example', DEMO_PASSWORD)
    await page.waitForURL(`${baseUrl}/`)
    await page.goto(`${baseUrl}/calculator`)
    await page.getByRole('button', { name: 'Clear' }).click()
    await page.locator('#calc-0-name').fill('Solvent A')
    await page.locator('#calc-0-exposure').fill('5000')
    await page.locator('#calc-0-limit').fill('1000')
    await page.getByRole('button', { name: 'Add a substance (mixture)' }).click()
    await page.locator('#calc-1-name').fill('Solvent B')
    await page.locator('#calc-1-exposure').fill('1350')
    await page.locator('#calc-1-limit').fill('200')
    // Derived from 29 CFR 1910.1000(d)(2)(i): 5000/1000 + 1350/200 = 11.75.
    await expect.poll(() => page.getByTestId('hazard-ratio').textContent()).toBe('11.8')
    await expect.poll(() => page.getByTestId('calculator-cautions').textContent()).toContain('Never use MUC for IDLH atmospheres')
    await page.getByLabel('Show classes that are not adequate too').check()
    await expect(page.getByLabel('Choose Elastomeric half mask').isDisabled()).resolves.toBe(true)
    await page.getByLabel('Choose Elastomeric full facepiece (air-purifying)').check()
    await page.getByLabel('Job or work area').fill('Chemical store decanting (e2e)')
    await page.getByLabel('Rationale for the chosen classes').fill('Mixture index 11.75: above the half mask APF of 10.')
    await screenshot(page, 'calculator-mixture')
    await page.getByRole('button', { name: 'Save draft assessment' }).click()
    await page.waitForURL(/\/calculator\/assessments\/[0-9a-f-]{36}$/)

    await page.getByRole('button', { name: 'Sign off' }).click()
    await expect.poll(() => page.getByTestId('assessment-state').textContent()).toContain('Signed off')
    await page.getByLabel('Job title').selectOption('Treatment operator')
    await page.getByRole('button', { name: 'Assign' }).click()
    await expect.poll(() => page.getByTestId('protection-table').textContent()).toContain('this job needs a full facepiece')
    await screenshot(page, 'calculator-who-is-protected')

    await page.setViewportSize({ width: 360, height: 800 })
    await screenshot(page, 'calculator-who-is-protected-narrow')
  })
})
