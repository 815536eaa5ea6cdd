// First-load JavaScript of a page, gzipped: every script the browser fetched while loading it in
// headless Chromium (module preloads included, idle-time prefetches not), each gzipped here.
import { gzipSync } from 'node:zlib'
import { chromium } from 'playwright-core'

export async function firstLoadJs(baseUrl: string, cookie: string, pages: { label: string, path: string, signedIn: boolean }[]) {
  const browser = await chromium.launch({
    executablePath: process.env.CHROMIUM_PATH || '/usr/bin/chromium',
    headless: true,
    args: ['--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync']
  })
  const out: { label: string, files: number, raw: number, gzipped: number }[] = []
  try {
    for (const page of pages) {
      const context = await browser.newContext({ viewport: { width: 1280, height: 900 } })
      if (page.signedIn) {
        const [name, value] = cookie.split(';')[0]!.split(/=(.*)/s) as [string, string]
        await context.addCookies([{ name, value, url: baseUrl }])
      }
      const tab = await context.newPage()
      const bodies: Promise<Buffer | null>[] = []
      tab.on('response', (response) => {
        if (response.request().resourceType() !== 'script') return
        const body = response.body().catch(() => null)
        bodies.push(body)
        // SEALWRIGHT_BENCH_VERBOSE=1 names each script, to see what a page pulls in.
        if (process.env.SEALWRIGHT_BENCH_VERBOSE === '1') void body.then(b => b && process.stdout.write(`    ${page.label}: ${response.url().split('/').pop()} ${(gzipSync(b).length / 1024).toFixed(1)} kB\n`))
      })
      await tab.goto(`${baseUrl}${page.path}`, { waitUntil: 'networkidle' })
      const scripts = (await Promise.all(bodies)).filter((b): b is Buffer => b !== null)
      out.push({
        label: page.label,
        files: scripts.length,
        raw: scripts.reduce((n, b) => n + b.length, 0),
        gzipped: scripts.reduce((n, b) => n + gzipSync(b).length, 0)
      })
      await context.close()
    }
  } finally {
    await browser.close()
  }
  return out
}
