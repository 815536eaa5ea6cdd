// `node scripts/bench-auth.mjs` against a running `npm start`: how long a sign-in and a reset
// request take for an address that has an account and for one that has none. Prints medians; the
// two columns should match (an answer's speed must not tell whether an account exists).
const port = Number(process.env.SEALWRIGHT_PORT || 3000)
const base = `http://127.0.0.1:${port}`
const rounds = Math.min(20, Number(process.env.BENCH_ROUNDS || 12))
const ROLES = ['admin', 'tester', 'reviewer', 'trainer', 'wearer']
const ORGS = ['tamsin-valley', 'harrow-point']
// Rotating through the demo accounts keeps each (e-mail, address) pair under its limit of 5.
const account = i => `${ROLES[i % ROLES.length]}@${ORGS[Math.floor(i / ROLES.length) % ORGS.length]}.example`

async function timed(path, body) {
  const started = performance.now()
  const response = await fetch(`${base}${path}`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify(body) })
  await response.arrayBuffer()
  return { ms: performance.now() - started, status: response.status }
}

function median(values) {
  const sorted = [...values].sort((a, b) => a - b)
  return sorted[Math.floor(sorted.length / 2)]
}

const cases = [
  ['sign-in, wrong password', '/api/auth/sign-in', i => ({ email: account(i), password: 'not-the-password' })],
  ['sign-in, unknown address', '/api/auth/sign-in', i => ({ email: `nobody-${i}@tamsin-valley.example`, password: 'not-the-password' })],
  ['reset, known address', '/api/auth/password-reset', i => ({ email: account(i) })],
  ['reset, unknown address', '/api/auth/password-reset', i => ({ email: `nobody-${i}@harrow-point.example` })]
]
console.log(`${rounds} rounds each, alternating, against ${base} (at most 20 rounds: the address's sign-in limit is 50 wrong passwords in 15 minutes)`)
const results = Object.fromEntries(cases.map(([name]) => [name, []]))
for (let i = 0; i < rounds; i++) {
  for (const [name, path, body] of cases) {
    const { ms, status } = await timed(path, body(i))
    if (status === 429) throw new Error('An attempt limit answered; wait 15 minutes or restart with a fresh database.')
    results[name].push(ms)
  }
}
for (const [name] of cases) console.log(`${name.padEnd(28)} median ${median(results[name]).toFixed(1)} ms`)
