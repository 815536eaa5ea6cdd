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

describe('signing in as the demo tester', () => {
  it('shows the overview with the organization, then signs out', async () => {
    const page = await browser.newPage({ viewport: { width: 1280, height: 800 } })
    await signInAs(page, 'tester@tamsin-valley.example', DEMO_PASSWORD)
    await page.waitForURL(`${baseUrl}/`)
    await page.getByTestId('organization-name').waitFor()
    await expect(page.getByTestId('organization-name').textContent()).resolves.toBe('Tamsin Valley Water Authority')
    await expect(page.getByTestId('signed-in-role').first().textContent()).resolves.toBe('Fit tester')
    // A tester is not offered the admin pages.
    expect(await page.getByRole('link', { name: 'Users' }).count()).toBe(0)
    await screenshot(page, 'overview-tester-desktop')

    await page.getByRole('button', { name: 'Sign out' }).click()
    await page.waitForURL(/\/sign-in/)
    await page.goto(`${baseUrl}/`)
    await page.waitForURL(/\/sign-in/)
    await page.close()
  })

  it('reads at 360 px wide with the menu behind a button', async () => {
    const page = await browser.newPage({ viewport: { width: 360, height: 740 } })
    await signInAs(page, 'tester@tamsin-valley.example', DEMO_PASSWORD)
    await page.waitForURL(`${baseUrl}/`)
    await page.getByRole('button', { name: 'Menu' }).waitFor({ state: 'visible' })
    // The side panel stays folded away until the menu is opened.
    expect(await page.getByRole('link', { name: 'Overview' }).isVisible()).toBe(false)
    await page.getByRole('button', { name: 'Menu' }).click()
    await page.getByRole('link', { name: 'Overview' }).waitFor({ state: 'visible' })
    const width = await page.evaluate(() => document.documentElement.scrollWidth)
    expect(width).toBeLessThanOrEqual(360)
    await screenshot(page, 'overview-tester-360')
    await page.close()
  })

  it('shows one generic message for a wrong password', async () => {
    const page = await browser.newPage()
    await signInAs(page, 'tester@harrow-point.example', 'not-the-password')
    await expect(page.getByRole('alert').textContent()).resolves.toMatch(/do not match an active account/)
    await screenshot(page, 'sign-in-refused')
    await page.close()
  })

  it('lets the demo admin open the users page of their organization only', async () => {
    const page = await browser.newPage({ viewport: { width: 1280, height: 900 } })
    await signInAs(page, 'admin@harrow-point.example', DEMO_PASSWORD)
    await page.waitForURL(`${baseUrl}/`)
    await page.getByRole('link', { name: 'Users' }).click()
    await page.waitForURL(/\/admin\/users/)
    await page.getByRole('cell', { name: 'tester@harrow-point.example' }).waitFor()
    expect(await page.getByRole('cell', { name: 'tester@tamsin-valley.example' }).count()).toBe(0)
    await screenshot(page, 'users-admin')
    await page.close()
  })
})
