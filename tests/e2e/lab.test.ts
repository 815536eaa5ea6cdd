import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Browser } from 'playwright-core'
import { DEMO_PASSWORD } from '../../scripts/seed/demo-accounts.mjs'
import { baseUrl, hydrated, launch, screenshot, signInAs } from '../support/browser'

let browser: Browser
beforeAll(async () => {
  browser = await launch()
})
afterAll(async () => {
  await browser?.close()
})

const COUNTED = ['Normal breathing (start)', 'Deep breathing', 'Turning head side to side', 'Moving head up and down', 'Talking', 'Bending over', 'Normal breathing (end)']

describe('a trainer teaches from the training lab', () => {
  it('compares two counters, runs 1,000 simulated tests, opens classroom mode', async () => {
    const page = await browser.newPage({ viewport: { width: 1280, height: 1000 } })
    await signInAs(page, 'trainer@tamsin-valley.example', DEMO_PASSWORD)
    await page.waitForURL(`${baseUrl}/`)
    await page.getByRole('link', { name: 'Training lab' }).click()
    await page.waitForURL(`${baseUrl}/lab`)
    await page.waitForFunction(() => (window as unknown as { useNuxtApp?: unknown }).useNuxtApp !== undefined || document.querySelector('[data-testid="planner-a"]'))

    // C = 1,000 /cm³, r = 10 %, FF 500: 30 s at 100 cm³/min (DOMAIN.md Test length check, derived);
    // at 350 cm³/min, 30 ÷ 3.5 = 8.6 s (derived: t ∝ 1/Q)
    await expect(page.getByTestId('seconds-a').textContent()).resolves.toBe('30 s')
    await expect(page.getByTestId('seconds-b').textContent()).resolves.toBe('8.6 s')
    await expect(page.getByTestId('planner-ratio').textContent()).resolves.toMatch(/3\.5 ×/)
    await expect(page.getByText('common practice (no published source)').first().isVisible()).resolves.toBe(true)
    await screenshot(page, 'lab-planner')

    // A zero flow is refused beside the field, and the set-up's figures step aside.
    await page.locator('#setup-a-flow').fill('0')
    await expect(page.getByText(/Counter sample flow must be above 0/).isVisible()).resolves.toBe(true)
    await expect(page.getByTestId('planner-a').count()).resolves.toBe(0)
    await screenshot(page, 'lab-planner-bad-input')
    await page.locator('#setup-a-flow').fill('100')
    await page.waitForURL(/aq=100/)

    // The set-up travels in the link.
    await page.locator('#plan-ff').fill('2000')
    await page.waitForURL(/ff=2000/)
    const shared = page.url()
    const second = await browser.newPage({ viewport: { width: 360, height: 800 }, storageState: await page.context().storageState() })
    await second.goto(shared)
    // FF 2000 at 100 cm³/min → 120 s (DOMAIN.md Test length check, derived)
    await expect(second.getByTestId('seconds-a').textContent()).resolves.toBe('120 s')
    await screenshot(second, 'lab-planner-360')
    await second.close()

    await page.getByRole('link', { name: 'Repeat it' }).click()
    await page.waitForURL(/\/lab\/repeat/)
    await page.locator('#run-runs').fill('1000')
    await page.getByRole('button', { name: 'Run 1000 simulated tests' }).click()
    await page.getByTestId('repeat-summary').waitFor()
    await expect(page.getByTestId('repeat-summary').textContent()).resolves.toMatch(/of 1,000/)
    await page.getByTestId('oc-summary').waitFor()
    await screenshot(page, 'lab-repeat')

    await page.getByRole('button', { name: 'Classroom mode' }).click()
    await expect(page.getByTestId('lab-shell').getAttribute('data-classroom')).resolves.toBe('true')
    await hydrated(page)
    await page.getByRole('link', { name: 'Lessons' }).click()
    await page.waitForURL(/\/lab\/lessons/)
    await hydrated(page)
    await page.getByRole('tab', { name: /One leaky exercise dominates/ }).click()
    // [1000×6, 10] → 66.0: DOMAIN.md overall fit factor check (29 CFR 1910.134 App. A Part I.C.2(c))
    await expect(page.getByTestId('lesson').textContent()).resolves.toContain('66.0')
    await screenshot(page, 'lab-classroom-lesson')
    await page.keyboard.press('Escape')
    await expect(page.getByTestId('lab-shell').getAttribute('data-classroom')).resolves.toBe('false')
    await page.close()
  })

  it('records a practice test through the real entry grid and clears the practice set', async () => {
    const page = await browser.newPage({ viewport: { width: 1280, height: 1000 } })
    await signInAs(page, 'trainer@tamsin-valley.example', DEMO_PASSWORD)
    await page.waitForURL(`${baseUrl}/`)
    await page.goto(`${baseUrl}/lab/practice`)
    const setName = `E2E class ${Date.now()}`
    await page.getByLabel('New practice set (one a class)').fill(setName)
    await page.getByRole('button', { name: 'Create practice set' }).click()
    const set = page.getByRole('region', { name: `Practice set ${setName}` })
    await set.getByLabel('Add an invented practice person').fill('Practice Person A')
    await set.getByRole('button', { name: 'Add', exact: true }).click()
    await set.getByLabel('Practice person', { exact: true }).selectOption({ label: 'Practice Person A' })
    await set.getByRole('button', { name: 'Start a practice test' }).click()
    await page.waitForURL(/\/lab\/practice\/[0-9a-f-]{36}$/)
    await expect(page.getByTestId('practice-banner').textContent()).resolves.toMatch(/never a program record/)

    for (const name of COUNTED) {
      await page.getByLabel(`Ambient before for ${name}`).fill('10000')
      await page.getByLabel(`Ambient after for ${name}`).fill('10000')
      await page.getByLabel(`In-mask for ${name}`).fill(name === 'Talking' ? '1000' : '10')
    }
    // [1000×6, 10] → 66.0 (DOMAIN.md overall fit factor check)
    await expect(page.getByTestId('overall-fit-factor').textContent()).resolves.toBe('66.0')
    await expect(page.getByTestId('verdict-word').textContent()).resolves.toBe('FAIL')
    await screenshot(page, 'lab-practice-entry')
    await page.getByRole('button', { name: 'Finish the practice test' }).click()
    await page.getByText('Practice — not a program record').waitFor()
    await page.waitForFunction(() => !document.querySelector('[data-after-grid]'))
    await screenshot(page, 'lab-practice-result')

    await page.getByRole('link', { name: '← Practice tests' }).click()
    await page.waitForURL(`${baseUrl}/lab/practice`)
    page.once('dialog', dialog => void dialog.accept())
    await page.getByRole('region', { name: `Practice set ${setName}` }).getByRole('button', { name: 'Clear this practice set' }).click()
    await expect(page.getByRole('status').filter({ hasText: 'Cleared' }).textContent()).resolves.toMatch(/1 practice person and 1 practice test\./)
    await screenshot(page, 'lab-practice-cleared')
    await page.close()
  })
})
