// `npm run bench:pages`: how long the result page takes with the demo data, against a running
// `npm start` (SEALWRIGHT_BENCH_URL, default http://127.0.0.1:3000). Prints figures; asserts nothing.
import { performance } from 'node:perf_hooks'
import { DEMO_PASSWORD } from './seed/demo-accounts.mjs'

const base = process.env.SEALWRIGHT_BENCH_URL || 'http://127.0.0.1:3000'
const rounds = Number(process.env.SEALWRIGHT_BENCH_ROUNDS || 40)

const signIn = await fetch(`${base}/api/auth/sign-in`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ email: 'tester@tamsin-valley.example', password: DEMO_PASSWORD }) })
if (!signIn.ok) {
  console.error(`Sign-in failed (${signIn.status}). Is \`npm start\` running at ${base} with the demo data?`)
  process.exit(1)
}
const cookie = signIn.headers.getSetCookie().map(c => c.split(';')[0]).join('; ')
const get = path => fetch(`${base}${path}`, { headers: { cookie } })
const list = await (await get('/api/fit-tests?pageSize=200&result=pass')).json()
const ids = list.rows.map(r => r.id)

async function time(label, pathOf) {
  const samples = []
  for (let i = 0; i < rounds; i++) {
    const path = pathOf(ids[i % ids.length])
    const started = performance.now()
    const response = await get(path)
    await response.arrayBuffer()
    samples.push(performance.now() - started)
    if (!response.ok) throw new Error(`${path} answered ${response.status}`)
  }
  samples.sort((a, b) => a - b)
  const at = q => samples[Math.min(samples.length - 1, Math.floor(q * samples.length))].toFixed(1)
  console.log(`${label.padEnd(44)} median ${at(0.5).padStart(7)} ms   p95 ${at(0.95).padStart(7)} ms   (${rounds} requests)`)
}

console.log(`${list.total} passing records in the demo organization; timing ${base}`)
await time('result data  GET /api/fit-tests/:id', id => `/api/fit-tests/${id}`)
await time('result page  GET /fit-tests/:id (server render)', id => `/fit-tests/${id}`)
await time('fit card     GET /api/fit-tests/:id/card (PDF)', id => `/api/fit-tests/${id}/card`)
await time('list         GET /api/fit-tests (25 per page)', () => '/api/fit-tests')
await time('roster       GET /api/people (25 per page)', () => '/api/people')
