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

async function startStandardTest(page: Page) {
  await signInAs(page, 'tester@tamsin-valley.example', DEMO_PASSWORD)
  await page.waitForURL(`${baseUrl}/`)
  await page.goto(`${baseUrl}/people`)
  await page.getByLabel('Search name, number or job').fill('Jonah')
  await page.getByRole('link', { name: 'Jonah Marsh' }).click()
  await page.getByRole('link', { name: 'New fit test' }).click()
  await page.waitForURL(/\/fit-tests\/new/)
  await page.getByLabel('Respirator', { exact: true }).selectOption({ label: 'Corvid Safety CV-2 half mask — Elastomeric half mask' })
  await page.getByLabel('Size', { exact: true }).selectOption('M')
  await page.getByLabel('Protocol', { exact: true }).selectOption({ label: 'Standard protocol' })
  for (const box of await page.getByRole('checkbox').all()) await box.check()
  await page.getByRole('button', { name: 'Start the test' }).click()
  await page.waitForURL(/\/fit-tests\/[0-9a-f-]{36}$/)
}

const COUNTED = ['Normal breathing (start)', 'Deep breathing', 'Turning head side to side', 'Moving head up and down', 'Talking', 'Bending over', 'Normal breathing (end)']

describe('a number typed in the grid is read one way, and a misread is visible', () => {
  it('reads "1,234" as 1 234 in point mode, so the leaky exercise fails the test', async () => {
    const page = await browser.newPage({ viewport: { width: 1280, height: 1000 } })
    await startStandardTest(page)
    // Six exercises at FF 1000 (10,000 / 10) and one in-mask typed as "1,234".
    for (const name of COUNTED) {
      await page.getByLabel(`Ambient before for ${name}`).fill('10000')
      await page.getByLabel(`Ambient after for ${name}`).fill('10,000')
      await page.getByLabel(`In-mask for ${name}`).fill(name === 'Talking' ? '1,234' : '10')
    }
    const talking = page.getByLabel('In-mask for Talking')
    // Point mode: a comma only groups thousands (DOMAIN.md "Typing numbers"), so "1,234" is 1234.
    await expect(page.locator(`#${await talking.getAttribute('id')}-as-read`).textContent()).resolves.toBe('= 1 234')
    // 10,000 / 1234 = 8.103 (derived); overall 7 / (6/1000 + 1/8.103) = 54.09 — harmonic mean,
    // 29 CFR 1910.134 App. A Part I.C.2(c) (formula from memory, high confidence); digits are cut,
    // not rounded. Read as 1.234 it would have been 8104 and a PASS.
    await expect(page.getByTestId('ff-talking').textContent()).resolves.toMatch(/^\s*8\.10\s*$/)
    await expect(page.getByTestId('overall-fit-factor').textContent()).resolves.toBe('54.0')
    await expect(page.getByTestId('verdict-word').textContent()).resolves.toBe('FAIL')
    await screenshot(page, 'numbers-grid-as-read')

    // "1,5" is ambiguous in point mode: refused beside the cell, naming the column and exercise, and no verdict.
    await page.getByLabel('In-mask for Deep breathing').fill('1,5')
    const refusal = page.getByTestId('cell-refused')
    await expect(refusal.textContent()).resolves.toBe('In-mask for Deep breathing: \'1,5\' is ambiguous: write 1.5 or 15.')
    expect(await page.getByTestId('verdict-word').count()).toBe(0)
    await page.getByTestId('refused-summary').waitFor()
    await page.getByRole('button', { name: 'Finish and lock the record' }).click()
    await page.getByText(/Correct the refused cell before finishing/).waitFor()
    await screenshot(page, 'numbers-grid-refused')

    // Corrected, the verdict comes back.
    await page.getByLabel('In-mask for Deep breathing').fill('10')
    await expect(page.getByTestId('verdict-word').textContent()).resolves.toBe('FAIL')
    await page.close()
  })

  it('fits a 360 px screen with the value as read beside the cell', async () => {
    const page = await browser.newPage({ viewport: { width: 360, height: 800 } })
    await startStandardTest(page)
    await page.getByLabel('In-mask for Talking').fill('12 500')
    await page.getByTestId('cell-as-read').first().waitFor()
    await screenshot(page, 'numbers-grid-360')
    await page.close()
  })
})
