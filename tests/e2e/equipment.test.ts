import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Browser, Page } from 'playwright-core'
import { DEMO_PASSWORD } from '../../scripts/seed/demo-accounts.mjs'
import { baseUrl, launch, screenshot, signInAs } from '../support/browser'

let browser: Browser
beforeAll(async () => {
  browser = await launch()
})
afterAll(async () => {
  await browser?.close()
})

const RIG = 'Bench rig HP-BR-01 (counter HP-PC-2231)'

/** The number that just meets the step's rule, read from its "Accepted:" line. */
function passingFrom(accepted: string) {
  const n = accepted.replace(/,/g, '').match(/-?\d+(\.\d+)?/)
  return n ? n[0] : '0'
}

/** Opens a page and waits until Vue has hydrated it, so a chosen option reaches the form's state. */
async function open(page: Page, path: string) {
  await page.goto(`${baseUrl}${path}`)
  await page.waitForFunction(() => Boolean((document.querySelector('#__nuxt') as { __vue_app__?: unknown } | null)?.__vue_app__))
  await page.waitForLoadState('networkidle')
}

async function startRigCheck(page: Page, maskType: string) {
  await open(page, '/equipment/checks')
  await page.locator('#start-target').selectOption({ label: RIG })
  await page.locator('#start-mask-type').selectOption({ label: maskType })
  await page.getByRole('button', { name: 'Start check' }).click()
  await page.waitForURL(/\/equipment\/checks\/[0-9a-f-]{36}$/)
  await page.getByTestId('runner-step').waitFor()
}

/** Runs the open check to its end with the keyboard; returns the step names the runner showed. */
async function runToEnd(page: Page, onStep?: (name: string, position: string) => Promise<void>) {
  const shown: string[] = []
  const step = page.getByTestId('runner-step')
  while (await step.count()) {
    const name = (await step.locator('h2').textContent())!.trim()
    const position = (await step.locator('p').first().textContent())!.trim()
    shown.push(name)
    await onStep?.(name, position)
    const input = step.locator('#step-value')
    const before = await step.locator('p').first().textContent()
    if (await input.count()) {
      const accepted = (await step.getByText(/^Accepted:/).textContent())!
      await input.fill(passingFrom(accepted.replace('Accepted:', '')))
      await input.press('Enter')
    } else {
      // The Pass button has the focus: Enter marks it.
      await page.keyboard.press('Enter')
    }
    await page.waitForFunction((prev) => {
      const card = document.querySelector('[data-testid="runner-step"]')
      return !card || card.querySelector('p')?.textContent !== prev
    }, before)
  }
  return shown
}

describe('the fit tester\'s bench day at Harrow Point', () => {
  it('runs a whole bench-rig check, then a failing headform test of a CBRN unit that is held', async () => {
    const page = await browser.newPage({ viewport: { width: 1280, height: 900 } })
    await signInAs(page, 'tester@harrow-point.example', DEMO_PASSWORD)
    await page.waitForURL(`${baseUrl}/`)
    await startRigCheck(page, 'CBRN full facepiece')

    const shown = await runToEnd(page, async (name) => {
      if (name === 'Hood aerosol level') {
        // Too little aerosol first: the verdict shows at once, then the step is recorded again.
        await page.locator('#step-value').fill('18000')
        await page.locator('#step-value').press('Enter')
        await page.getByRole('alert').filter({ hasText: 'Fail' }).waitFor()
        await screenshot(page, 'runner-step-failed-then-retry')
        // A reload loses nothing: the check resumes at the same step with its history.
        await page.reload()
        await page.waitForFunction(() => Boolean((document.querySelector('#__nuxt') as { __vue_app__?: unknown } | null)?.__vue_app__))
        await page.getByTestId('runner-step').getByRole('heading', { name: 'Hood aerosol level' }).waitFor()
        expect(await page.getByTestId('step-list').getByText(/18000 — fail/).count()).toBe(1)
      }
    })
    expect(shown).toContain('Drink-tube line check')
    expect(shown).toContain('Exhalation-valve port check')
    const summary = page.getByTestId('check-summary')
    await expect(summary.textContent()).resolves.toMatch(/Passed.*locked/s)
    expect(await page.getByTestId('step-list').getByText(/attempt 2/).count()).toBe(1)
    await screenshot(page, 'runner-summary-passed')

    await open(page, '/equipment/headform')
    await page.locator('#hf-unit').selectOption({ label: 'HP-MU-0002 — Quillon Protective QP-12 CBRN full facepiece (CBRN full facepiece)' })
    await page.locator('#hf-outside').fill('25000')
    await page.locator('#hf-inside').fill('40')
    for (const label of ['Head harness and buckles intact', 'Lens and sealing face free of cracks and set', 'Exhalation valve seats and closes', 'Drink tube cap closes and holds']) {
      await page.getByLabel(`${label}: pass`).check()
    }
    // 25,000 / 40 = 625, below the default 2,000 (NIOSH CBRN laboratory protection level, from memory).
    await expect(page.getByTestId('headform-result').textContent()).resolves.toMatch(/Preview.*Fail.*625.*2000.*NIOSH CBRN laboratory protection level \(from memory\)/s)
    await page.getByRole('button', { name: 'Save headform test' }).click()
    const result = page.getByTestId('headform-result')
    await result.getByText('Saved result').waitFor()
    await expect(result.textContent()).resolves.toMatch(/✕ Fail/)
    await expect(page.getByTestId('coverage').textContent()).resolves.toMatch(/Covered by a readiness check\. Readiness check passed at/)
    await expect(page.locator('#state-reason').inputValue()).resolves.toMatch(/Failed headform test/)
    await page.getByRole('button', { name: 'Hold this unit' }).click()
    await page.getByText('Unit HP-MU-0002 is held.').waitFor()
    await screenshot(page, 'headform-failed-held')

    await page.getByRole('link', { name: 'Open unit HP-MU-0002' }).click()
    await page.getByTestId('unit-chart').locator('canvas').waitFor()
    await expect(page.locator('main').textContent()).resolves.toMatch(/Held/)
    await expect(page.locator('main').textContent()).resolves.toMatch(/In service → Held — Failed headform test/)
    await page.waitForTimeout(300)
    await screenshot(page, 'mask-unit-chart')
    await page.close()
  })

  it('skips the drink-tube and valve steps and sub-checks for a breathing-apparatus facepiece', async () => {
    const page = await browser.newPage({ viewport: { width: 360, height: 800 } })
    await signInAs(page, 'tester@harrow-point.example', DEMO_PASSWORD)
    await page.waitForURL(`${baseUrl}/`)
    await startRigCheck(page, 'Breathing-apparatus facepiece')
    expect(await page.getByTestId('step-list').getByText('Skipped: this mask type has no such part').count()).toBe(2)
    await screenshot(page, 'runner-step-360')
    const shown = await runToEnd(page)
    expect(shown).not.toContain('Drink-tube line check')
    expect(shown).not.toContain('Exhalation-valve port check')
    await expect(page.getByTestId('check-summary').textContent()).resolves.toMatch(/Passed/)
    const width = await page.evaluate(() => document.documentElement.scrollWidth)
    expect(width).toBeLessThanOrEqual(360)

    await open(page, '/equipment/headform')
    await page.locator('#hf-unit').selectOption({ label: 'HP-MU-0027 — Ostler Breathing OB-2 breathing-apparatus facepiece (Breathing-apparatus facepiece)' })
    expect(await page.getByLabel(/Drink tube cap/).count()).toBe(0)
    expect(await page.getByLabel(/Exhalation valve seats/).count()).toBe(0)
    await page.locator('#hf-outside').fill('26000')
    await page.locator('#hf-inside').fill('5')
    await page.getByLabel('Head harness and buckles intact: pass').check()
    await page.getByLabel('Lens and sealing face free of cracks and set: pass').check()
    await page.getByRole('button', { name: 'Save headform test' }).click()
    await page.getByTestId('headform-result').getByText('Saved result').waitFor()
    // 26,000 / 5 = 5,200 ≥ 1,000, the demo program's own level for this type (derived).
    await expect(page.getByTestId('headform-result').textContent()).resolves.toMatch(/Saved result.*✓ Pass.*5200/s)
    await page.close()
  })

  it('shows a reviewer the equipment pages to read, with nothing to change', async () => {
    const page = await browser.newPage({ viewport: { width: 1280, height: 900 } })
    await signInAs(page, 'reviewer@harrow-point.example', DEMO_PASSWORD)
    await page.waitForURL(`${baseUrl}/`)
    await page.getByTestId('overview-equipment').getByText('Bench rig HP-BR-01').waitFor()
    await screenshot(page, 'overview-equipment-reviewer')
    await page.getByRole('link', { name: 'Counters and rigs' }).click()
    await page.getByRole('cell', { name: /HP-PC-2231/ }).first().waitFor()
    expect(await page.getByText('Add a counter').count()).toBe(0)
    await screenshot(page, 'counters-reviewer')
    await page.getByRole('link', { name: 'Readiness templates' }).click()
    await page.getByRole('heading', { name: 'Bench rig day-start (Sealwright default)' }).waitFor()
    expect(await page.getByRole('button', { name: 'New template' }).count()).toBe(0)
    await screenshot(page, 'templates-reviewer')
    await page.getByRole('link', { name: 'Mask units' }).click()
    await page.getByRole('link', { name: 'HP-MU-0030' }).waitFor()
    expect(await page.getByText('Add a mask unit').count()).toBe(0)
    expect(await page.getByRole('link', { name: 'Headform test' }).count()).toBe(0)
    await screenshot(page, 'mask-units-reviewer')
    await page.close()
  })
})
