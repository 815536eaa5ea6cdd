import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { signedIn } from '../support/http'
import { baseUrl } from '../support/env'
import type { Client } from '../support/http'
import { closeTestDb, createOrganization } from '../support/fixtures'

// The error convention of DEVELOPERS.md "Errors": the sentence a person reads travels in
// `message`, a short reason phrase in `statusMessage`, field messages in `data.fieldErrors`.
// h3 strips every non-ASCII character from `statusMessage`, so a sentence put there would lose
// "cm³" and "—" on the way to the browser; these checks fail if one ever moves back there.
let tester: Client

beforeAll(async () => {
  const org = await createOrganization('Glyph')
  tester = await signedIn(org.users.tester.email, org.users.tester.password)
})

afterAll(async () => {
  await closeTestDb()
})

describe('a refusal reaches the browser as written', () => {
  it('keeps "cm³" in the sentence and beside the field', async () => {
    const reply = await tester.post('/api/counters', { serialNumber: 'GLYPH-1', sampleFlowCm3PerMin: 0 })
    expect(reply.status).toBe(400)
    expect(reply.body.statusMessage).toBe('Bad Request')
    expect(reply.body.message).toMatch(/cm³\/min/)
    expect(reply.body.data.fieldErrors.sampleFlowCm3PerMin).toMatch(/cm³\/min/)
  })

  it('keeps the em dash in the sentence', async () => {
    const reply = await tester.post('/api/counters', { serialNumber: 'GLYPH\u0000-2', sampleFlowCm3PerMin: 100 })
    expect(reply.status).toBe(400)
    expect(reply.body.message).toContain('—')
    expect(reply.body.message).toContain('\'serialNumber\'')
    expect(reply.body.data.fieldErrors.serialNumber).toBeTruthy()
  })
})

describe('an address no route answers', () => {
  it('gets a JSON 404, signed in or not, never the sign-in page', async () => {
    for (const path of ['/api/no-such-thing', '/api/people/not-a-route/at-all']) {
      const anonymous = await fetch(new URL(path, baseUrl), { redirect: 'manual' })
      expect(anonymous.status).toBe(404)
      expect(anonymous.headers.get('content-type')).toMatch(/json/)
      expect((await anonymous.json()).message).toMatch(/no such address/)
      expect((await tester.get(path)).status).toBe(404)
    }
  })
})
