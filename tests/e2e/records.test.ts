import { execFileSync } from 'node:child_process'
import { randomUUID } from 'node:crypto'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Browser, Page } from 'playwright-core'
import { DEMO_PASSWORD } from '../../scripts/seed/demo-accounts.mjs'
import { allPreTestMet, standardEntry } from '../support/fit-test-inputs'
import { baseUrl, launch, screenshot, signInAs } from '../support/browser'

// Cards and verification that tell the truth (issue 8, items 2, 3, 8). Equal exercises give that fit factor overall (harmonic mean, 29 CFR 1910.134 App. A
// Part I.C.2(c)); the half-mask pass level is 100 (29 CFR 1910.134(f)(7)).

let browser: Browser
beforeAll(async () => {
  browser = await launch()
})
afterAll(async () => {
  await browser?.close()
})

/**
 * Records and finishes a standard-protocol test through the API with the page's own session. With
 * `uncovered`, the test is moved back a day at a time until no readiness check covers it.
 */
async function finishedTest(page: Page, fitFactor: number, uncovered = false) {
  const options = await (await page.request.get(`${baseUrl}/api/fit-test-options`)).json()
  const person = options.people[0]
  const model = options.respiratorModels.find((m: { id: string, respiratorClass: string }) => m.respiratorClass === 'elastomeric-half-mask' && !options.trackedModelIds.includes(m.id))
  const created = await page.request.post(`${baseUrl}/api/fit-tests`, {
    data: {
      idempotencyKey: randomUUID(), personId: person.id, respiratorModelId: model.id, respiratorSize: model.sizes[0], protocolKey: 'osha-standard',
      counterId: options.counters[0].id, siteId: person.siteId ?? options.sites[0].id, preTest: allPreTestMet,
      entry: standardEntry(Array(7).fill(fitFactor))
    }
  })
  expect(created.status()).toBe(201)
  let draft = await created.json()
  for (let daysBack = 1; uncovered && draft.coverage?.covered && daysBack < 15; daysBack++) {
    const at = new Date(Date.now() - daysBack * 86_400_000).toISOString()
    draft = await (await page.request.patch(`${baseUrl}/api/fit-tests/${draft.id}`, { data: { version: draft.version, performedAt: at } })).json()
  }
  const done = await page.request.post(`${baseUrl}/api/fit-tests/${draft.id}/finish`, { data: { version: draft.version } })
  expect(done.status()).toBe(200)
  return done.json()
}

describe('fit cards and their verification', () => {
  it('gives a failed test no card button and no verification link', async () => {
    const page = await browser.newPage({ viewport: { width: 1280, height: 900 } })
    await signInAs(page, 'tester@tamsin-valley.example', DEMO_PASSWORD)
    await page.waitForURL(`${baseUrl}/`)
    const failed = await finishedTest(page, 50)
    await page.goto(`${baseUrl}/fit-tests/${failed.id}`)
    await page.getByTestId('verdict-word').waitFor()
    await expect(page.getByTestId('verdict-word').textContent()).resolves.toBe('FAIL')
    await expect(page.getByTestId('no-card').textContent()).resolves.toMatch(/no fit card for a test that did not pass/)
    expect(await page.getByTestId('card-link').count()).toBe(0)
    expect(await page.getByTestId('verify-link').count()).toBe(0)
    await screenshot(page, 'failed-test-no-card')
    await page.close()
  })

  it('says "not covered" on the verdict, the one-page card and the verification page of an uncovered pass', async () => {
    const page = await browser.newPage({ viewport: { width: 1280, height: 1000 } })
    await signInAs(page, 'tester@tamsin-valley.example', DEMO_PASSWORD)
    await page.waitForURL(`${baseUrl}/`)
    const passed = await finishedTest(page, 300, true)
    expect(passed.coverageFlag).toBe('not-covered')
    await page.goto(`${baseUrl}/fit-tests/${passed.id}`)
    await page.getByTestId('verdict-word').waitFor()
    await expect(page.getByTestId('verdict-word').textContent()).resolves.toBe('PASS')
    await expect(page.getByTestId('verdict-coverage').textContent()).resolves.toMatch(/Not covered by a readiness check/)
    await screenshot(page, 'uncovered-pass-result')

    const href = await page.getByTestId('card-link').getAttribute('href')
    const card = await page.request.get(`${baseUrl}${href}`)
    expect(card.headers()['content-type']).toBe('application/pdf')
    const pdf = await card.body()
    const info = execFileSync('pdfinfo', ['-'], { input: pdf }).toString()
    expect(info).toMatch(/Pages:\s+1\n/)
    // A6 landscape: 419.53 × 297.64 pt (ISO 216, 148 × 105 mm).
    expect(info).toMatch(/Page size:\s+419\.53 x 297\.64 pts/)
    const text = execFileSync('pdftotext', ['-', '-'], { input: pdf }).toString()
    expect(text).toMatch(/NOT COVERED/)
    expect(text).toMatch(/29 CFR 1910\.134\(m\)\(2\)/)
    expect(text).toMatch(/not a guarantee in the workplace/)

    await page.getByTestId('verify-link').click()
    await page.getByTestId('card-state').waitFor()
    await expect(page.getByTestId('card-state').textContent()).resolves.toMatch(/Valid, not covered/)
    await expect(page.getByTestId('card-coverage').textContent()).resolves.toMatch(/^Not covered/)
    await screenshot(page, 'uncovered-pass-verification')
    await page.setViewportSize({ width: 360, height: 800 })
    await screenshot(page, 'uncovered-pass-verification-narrow')
    await page.close()
  })
})
