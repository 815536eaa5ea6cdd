import { mkdirSync } from 'node:fs'
import { join } from 'node:path'
import { chromium } from 'playwright-core'
import type { Browser, Page } from 'playwright-core'
import { baseUrl, projectDir } from './env'

export const screenshotDir = join(projectDir, 'test-results', 'screenshots')

export async function launch(): Promise<Browser> {
  return chromium.launch({
    executablePath: process.env.CHROMIUM_PATH || '/usr/bin/chromium',
    headless: true,
    args: ['--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync']
  })
}

export async function screenshot(page: Page, name: string) {
  mkdirSync(screenshotDir, { recursive: true })
  await page.screenshot({ path: join(screenshotDir, `${name}.png`), fullPage: true })
}

export async function signInAs(page: Page, email: string, password: string) {
  await page.goto(`${baseUrl}/sign-in`)
  await page.getByLabel('E-mail').fill(email)
  await page.getByLabel('Password').fill(password)
  await page.getByRole('button', { name: 'Sign in' }).click()
}

export { baseUrl }

/**
 * Waits until Vue has hydrated the page in hand and its first requests have settled: before that,
 * a choice in a select or a click on a link reaches the browser's own default, not the app.
 */
export async function hydrated(page: Page) {
  await page.waitForFunction(() => Boolean((document.querySelector('#__nuxt') as { __vue_app__?: unknown } | null)?.__vue_app__))
  await page.waitForLoadState('networkidle')
}

/**
 * Records every Content-Security-Policy refusal on the page (the browser's own
 * `securitypolicyviolation` event, plus its console report) so a test can assert there were none.
 */
export async function watchPolicyViolations(page: Page) {
  const seen: string[] = []
  page.on('console', (message) => {
    if (/Content Security Policy|Refused to (execute|load|apply|connect|frame)/i.test(message.text())) seen.push(message.text())
  })
  await page.exposeFunction('__reportPolicyViolation', (text: string) => {
    seen.push(text)
  })
  await page.addInitScript(() => {
    document.addEventListener('securitypolicyviolation', (event) => {
      (window as unknown as { __reportPolicyViolation: (t: string) => void }).__reportPolicyViolation(`${event.violatedDirective} refused ${event.blockedURI || 'inline'} at ${event.sourceFile}:${event.lineNumber}`)
    })
  })
  return seen
}
