import { execFileSync } from 'node:child_process'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Browser, Page } from 'playwright-core'
import { DEMO_PASSWORD } from '../../scripts/seed/demo-accounts.mjs'
import { baseUrl, launch, screenshot, signInAs } from '../support/browser'

let browser: Browser
let testUrl = ''
let keystrokes = 0

beforeAll(async () => {
  browser = await launch()
})
afterAll(async () => {
  await browser?.close()
  console.log(`Keystrokes to enter the standard protocol in the grid: ${keystrokes}`)
})

/** Types a value and presses Enter, as a tester at the bench would, counting every key. */
async function typeCell(page: Page, value: string) {
  await page.keyboard.type(value)
  await page.keyboard.press('Enter')
  keystrokes += value.length + 1
}

describe('a tester records a standard-protocol test by keyboard', () => {
  it('shows the DOMAIN.md check cases as they are typed, finishes, and issues a card that verifies', async () => {
    const page = await browser.newPage({ viewport: { width: 1280, height: 1000 } })
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
    await expect(page.getByTestId('pre-test-warning').isVisible()).resolves.toBe(true)
    for (const box of await page.getByRole('checkbox').all()) await box.check()
    await page.getByRole('button', { name: 'Start the test' }).click()
    await page.waitForURL(/\/fit-tests\/[0-9a-f-]{36}$/)
    testUrl = page.url()

    // Seven counted exercises: ambient before, ambient after, in-mask. The grimace has no cells.
    await page.getByLabel('Ambient before for Normal breathing (start)').focus()
    const rows = [['10000', '10000', '10'], ['10000', '10000', '10'], ['10000', '10000', '10'], ['10000', '10000', '10'], ['10000', '10000', '10'], ['10000', '10000', '10'], ['10000', '10000', '1000']]
    for (const row of rows) for (const value of row) await typeCell(page, value)
    // [1000×6, 10] → 66.04: 29 CFR 1910.134 App. A Part I.C.2(c) harmonic mean (DOMAIN.md check value).
    await expect(page.getByTestId('overall-fit-factor').textContent()).resolves.toBe('66.0')
    await expect(page.getByTestId('verdict-word').textContent()).resolves.toBe('FAIL')
    await screenshot(page, 'fit-test-grid')

    // Exactly 100 in every exercise gives an overall of exactly 100, which passes — 29 CFR 1910.134(f)(7), ≥.
    for (const label of ['Normal breathing (start)', 'Deep breathing', 'Turning head side to side', 'Moving head up and down', 'Talking', 'Bending over', 'Normal breathing (end)']) {
      await page.getByLabel(`In-mask for ${label}`).fill('100')
    }
    await expect(page.getByTestId('overall-fit-factor').textContent()).resolves.toBe('100.0')
    await expect(page.getByTestId('verdict-word').textContent()).resolves.toBe('PASS')
    await page.getByTestId('save-state').filter({ hasText: 'Draft saved' }).waitFor()
    await page.getByRole('button', { name: 'Finish and lock the record' }).click()
    await page.getByTestId('card-link').waitFor()
    await expect(page.getByTestId('verdict-word').textContent()).resolves.toBe('PASS')
    await page.locator('canvas').first().waitFor()
    await page.waitForTimeout(300)
    await screenshot(page, 'fit-test-result')

    const card = await page.request.get(`${baseUrl}${await page.getByTestId('card-link').getAttribute('href')}`)
    expect(card.headers()['content-type']).toBe('application/pdf')
    const text = execFileSync('pdftotext', ['-', '-'], { input: await card.body() }).toString()
    expect(text).toContain('100.0')
    const due = new Date()
    due.setUTCFullYear(due.getUTCFullYear() + 1)
    expect(text).toContain(String(due.getUTCFullYear()))
    expect(text).toMatch(new RegExp(`\\d{1,2} ${due.toLocaleString('en-GB', { month: 'short', timeZone: 'UTC' })} ${due.getUTCFullYear()}`))

    await page.getByTestId('verify-link').click()
    await page.getByTestId('card-state').waitFor()
    await expect(page.getByTestId('card-state').textContent()).resolves.toMatch(/Valid/)
    await screenshot(page, 'fit-card-verified')
    await page.close()
  })

  it('lets a reviewer read the result but not change it', async () => {
    const page = await browser.newPage({ viewport: { width: 1280, height: 900 } })
    await signInAs(page, 'reviewer@tamsin-valley.example', DEMO_PASSWORD)
    await page.waitForURL(`${baseUrl}/`)
    await page.goto(testUrl)
    await page.getByTestId('verdict-word').waitFor()
    await expect(page.getByTestId('verdict-word').textContent()).resolves.toBe('PASS')
    expect(await page.getByRole('button', { name: 'Correct this record…' }).count()).toBe(0)
    expect(await page.getByRole('link', { name: 'New fit test' }).count()).toBe(0)
    await page.close()
  })

  it('shows a wearer only their own records and card', async () => {
    const page = await browser.newPage({ viewport: { width: 390, height: 844 } })
    await signInAs(page, 'wearer@tamsin-valley.example', DEMO_PASSWORD)
    await page.waitForURL(`${baseUrl}/`)
    await page.goto(`${baseUrl}/fit-tests`)
    await page.getByRole('heading', { name: 'My fit tests' }).waitFor()
    const people = await page.locator('tbody tr').count()
    expect(people).toBeGreaterThan(0)
    expect(await page.getByRole('columnheader', { name: 'Person' }).count()).toBe(0)
    await page.goto(testUrl)
    await page.getByTestId('card-link').waitFor()
    await screenshot(page, 'wearer-own-record')
    const foreign = await page.request.get(`${baseUrl}/api/people`)
    expect(foreign.status()).toBe(403)
    await page.close()
  })
})
