// The pages run under the Content-Security-Policy without a single refusal: no inline script, no
// blocked font, image or request. Every page of the side panel, a fit-test record and the sign-in
// pages are visited as the demo administrator and tester.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Browser } from 'playwright-core'
import { DEMO_PASSWORD } from '../../scripts/seed/demo-accounts.mjs'
import { baseUrl, launch, signInAs, watchPolicyViolations } from '../support/browser'

const PAGES = ['/', '/fit-tests', '/fit-tests/new', '/people', '/people/new', '/people/import', '/equipment/checks', '/equipment/headform', '/equipment/masks', '/equipment/counters', '/equipment/templates']
const ADMIN_PAGES = ['/admin/catalogue', '/admin/users', '/admin/outbox', '/admin/settings']

let browser: Browser
beforeAll(async () => {
  browser = await launch()
})
afterAll(async () => {
  await browser?.close()
})

describe('the content security policy', () => {
  it('refuses nothing on the public pages', async () => {
    const page = await browser.newPage({ viewport: { width: 1280, height: 800 } })
    const violations = await watchPolicyViolations(page)
    for (const path of ['/sign-in', '/forgot-password']) {
      const response = await page.goto(`${baseUrl}${path}`)
      expect(response?.headers()['content-security-policy']).toMatch(/frame-ancestors 'none'/)
      await page.waitForLoadState('networkidle')
    }
    expect(violations).toEqual([])
    await page.close()
  })

  it('refuses nothing on any page the administrator opens, a fit-test record included', async () => {
    const page = await browser.newPage({ viewport: { width: 1280, height: 800 } })
    const violations = await watchPolicyViolations(page)
    await signInAs(page, 'admin@tamsin-valley.example', DEMO_PASSWORD)
    await page.waitForURL(`${baseUrl}/`)
    for (const path of [...PAGES, ...ADMIN_PAGES]) {
      await page.goto(`${baseUrl}${path}`)
      await page.waitForLoadState('networkidle')
    }
    await page.goto(`${baseUrl}/fit-tests`)
    const firstRecord = page.locator('a[href^="/fit-tests/"]:not([href="/fit-tests/new"])').first()
    await firstRecord.click()
    await page.waitForURL(/\/fit-tests\/[0-9a-f-]{36}/)
    await page.waitForLoadState('networkidle')
    expect(violations).toEqual([])
    await page.close()
  })
})
