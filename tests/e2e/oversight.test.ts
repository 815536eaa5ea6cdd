import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Browser } from 'playwright-core'
import { DEMO_PASSWORD } from '../../scripts/seed/demo-accounts.mjs'
import { baseUrl, launch, screenshot, signInAs } from '../support/browser'
import { latestMailTo, linkTokenOf } from '../support/outbox'

let browser: Browser
beforeAll(async () => {
  browser = await launch()
})
afterAll(async () => {
  await browser?.close()
})

describe('program oversight in the browser', () => {
  it('an admin sees the due list, reminds two people now and reads the mail in the Outbox', async () => {
    const page = await browser.newPage({ viewport: { width: 1280, height: 1000 } })
    await signInAs(page, 'admin@tamsin-valley.example', DEMO_PASSWORD)
    await page.waitForURL(`${baseUrl}/`)
    await page.getByRole('heading', { name: 'Who is due' }).waitFor()
    await page.getByRole('link', { name: 'Open the due list' }).click()
    await page.waitForURL(`${baseUrl}/due`)
    await page.getByTestId('due-table').waitFor()
    // Two people who have an address and did not opt out.
    const rows = page.locator('[data-testid="due-table"] tbody tr').filter({ hasText: 'None sent yet' })
    const names = [await rows.nth(0).locator('a').innerText(), await rows.nth(1).locator('a').innerText()]
    await rows.nth(0).getByRole('checkbox').check()
    await rows.nth(1).getByRole('checkbox').check()
    await page.getByTestId('remind-preview').click()
    await page.getByRole('heading', { name: 'Before sending: 2 of 2 will get a reminder' }).waitFor()
    await screenshot(page, 'oversight-due-list-preview-1280')
    await page.getByTestId('remind-send').click()
    // The panel answers with a status line (or an alert saying what went wrong); read whichever came.
    const answer = page.getByTestId('remind-notice')
    await answer.waitFor({ timeout: 60_000 })
    expect((await answer.innerText()).trim()).toBe('2 reminders sent.')

    await page.goto(`${baseUrl}/admin/outbox`)
    const reminders = page.getByRole('button', { name: /Tamsin Valley Water Authority: your respirator fit test or clearance is due/ })
    await reminders.first().waitFor()
    expect(await reminders.count()).toBeGreaterThanOrEqual(2)
    await reminders.first().click()
    await page.getByText(new RegExp(`Hello (${names.join('|')}),`)).first().waitFor()
    await screenshot(page, 'oversight-outbox-1280')

    await page.setViewportSize({ width: 360, height: 900 })
    await page.goto(`${baseUrl}/due`)
    await page.getByTestId('due-table').waitFor()
    await screenshot(page, 'oversight-due-list-360')
    await page.close()
  })

  it('a wearer invited with their roster e-mail is linked and sees both of their respirators', async () => {
    const admin = await browser.newPage({ viewport: { width: 1280, height: 1000 } })
    await signInAs(admin, 'admin@tamsin-valley.example', DEMO_PASSWORD)
    await admin.waitForURL(`${baseUrl}/`)
    // The demo's second person wears a second model fitted before Sealwright (scripts/seed/oversight.ts).
    const people = await admin.request.get(`${baseUrl}/api/people?q=TV-1043`)
    const person = (await people.json()).rows[0] as { id: string, fullName: string }
    const detail = await (await admin.request.get(`${baseUrl}/api/people/${person.id}`)).json() as { email: string, respirators: unknown[] }
    expect(detail.respirators.length).toBeGreaterThanOrEqual(2)
    await admin.goto(`${baseUrl}/admin/users`)
    await admin.getByLabel('Name', { exact: true }).fill(person.fullName)
    await admin.getByLabel('E-mail', { exact: true }).fill(detail.email)
    await admin.getByLabel('Role', { exact: true }).selectOption('wearer')
    await admin.getByRole('button', { name: 'Add and send invitation' }).click()
    const token = linkTokenOf(await latestMailTo(detail.email))
    await admin.close()

    const wearer = await browser.newPage({ viewport: { width: 360, height: 900 } })
    await wearer.goto(`${baseUrl}/set-password?token=${token}`)
    await wearer.getByLabel('New password').fill('invented-wearer-pass-1')
    await wearer.getByLabel('Repeat the password').fill('invented-wearer-pass-1')
    await wearer.getByRole('button', { name: 'Save and sign in' }).click()
    await wearer.waitForURL(`${baseUrl}/`)
    const list = wearer.getByTestId('my-respirators')
    await list.waitFor()
    expect(await list.locator('li').count()).toBeGreaterThanOrEqual(2)
    await expect(list.getByText('imported history').isVisible()).resolves.toBe(true)
    await screenshot(wearer, 'oversight-wearer-respirators-360')
    await wearer.close()
  })
})
