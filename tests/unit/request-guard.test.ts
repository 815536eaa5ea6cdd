import { describe, expect, it } from 'vitest'
import { BODY_LIMIT_BYTES, SERIES_BODY_LIMIT_BYTES, bodyLimitFor, changesState, isCrossSite } from '../../server/utils/request-guard'
import { describeError, redactMessage } from '../../server/utils/log'
import { isConnectionFailure } from '../../server/utils/db-outcome'
import { outageMessage } from '../../server/error-handler'

const own = ['http://127.0.0.1:3000']

describe('cross-site state changes', () => {
  // Header meanings: Fetch Metadata Request Headers (W3C), "Sec-Fetch-Site"; RFC 6454 §7 (Origin).
  it.each([
    { why: 'same-origin fetch', headers: { secFetchSite: 'same-origin', origin: 'http://127.0.0.1:3000' }, cross: false },
    { why: 'a script with neither header', headers: {}, cross: false },
    { why: 'another site by Sec-Fetch-Site', headers: { secFetchSite: 'cross-site' }, cross: true },
    { why: 'a sibling subdomain', headers: { secFetchSite: 'same-site' }, cross: true },
    { why: 'another origin, old browser without Sec-Fetch-Site', headers: { origin: 'https://elsewhere.example' }, cross: true },
    { why: 'a sandboxed frame (Origin: null)', headers: { origin: 'null' }, cross: true },
    { why: 'the same origin in capitals', headers: { origin: 'HTTP://127.0.0.1:3000' }, cross: false },
    { why: 'same host, another port', headers: { origin: 'http://127.0.0.1:3001' }, cross: true }
  ])('$why → cross-site $cross (common practice, no published source)', ({ headers, cross }) => {
    expect(isCrossSite(headers, own)).toBe(cross)
  })

  it.each([['POST', true], ['PATCH', true], ['PUT', true], ['DELETE', true], ['GET', false], ['HEAD', false], ['OPTIONS', false]])('%s changes state: %s (RFC 9110 §9.2.1, safe methods)', (method, expected) => {
    expect(changesState(method)).toBe(expected)
  })
})

describe('body limits', () => {
  it.each([
    ['/api/fit-tests', SERIES_BODY_LIMIT_BYTES],
    ['/api/fit-tests/0b7c7c5e-8f6c-4f4e-9f39-1d1f2b1d5c11', SERIES_BODY_LIMIT_BYTES],
    ['/api/fit-tests/0b7c7c5e-8f6c-4f4e-9f39-1d1f2b1d5c11/revisions', SERIES_BODY_LIMIT_BYTES],
    ['/api/fit-tests/0b7c7c5e-8f6c-4f4e-9f39-1d1f2b1d5c11/finish', BODY_LIMIT_BYTES],
    ['/api/people', BODY_LIMIT_BYTES],
    ['/api/imports/people?firstRow=2', BODY_LIMIT_BYTES]
  ])('%s may carry %i bytes (our rule: 2 MB, 8 MB where a count series travels)', (path, limit) => {
    expect(bodyLimitFor(path)).toBe(limit)
  })
})

describe('log lines', () => {
  it('blank quoted values, key details and e-mail addresses out of messages', () => {
    expect(redactMessage('invalid input syntax for type uuid: "Rowan Testwell"')).toBe('invalid input syntax for type uuid: "…"')
    expect(redactMessage('Key (email)=(rowan@fixture.example) already exists.')).toBe('Key (…)=(…) already exists.')
    expect(redactMessage('mail to rowan@fixture.example failed')).toBe('mail to …@… failed')
  })

  it('describe a database error by code and constraint only, never its message', () => {
    const error = Object.assign(new Error('duplicate key value violates unique constraint; Key (full_name)=(Rowan Testwell)'), { severity: 'ERROR', code: '23505', constraint: 'people_unique', table: 'people' })
    const line = describeError(error)
    expect(line).toContain('code=23505')
    expect(line).toContain('constraint=people_unique')
    expect(line).not.toContain('Rowan')
  })
})

describe('outages', () => {
  it.each([
    [Object.assign(new Error('connect ECONNREFUSED 127.0.0.1:54329'), { code: 'ECONNREFUSED' }), true],
    [new Error('Client has encountered a connection error and is not queryable'), true],
    [new Error('Connection terminated unexpectedly'), true],
    [Object.assign(new Error('terminating connection due to administrator command'), { code: '57P01' }), true],
    [{ message: 'wrapped', cause: Object.assign(new Error('x'), { code: '08006' }) }, true],
    [Object.assign(new Error('duplicate key'), { code: '23505' }), false],
    [new TypeError('Cannot read properties of undefined'), false]
  ])('connection failure %#: %s (PostgreSQL Appendix A classes 08 and 57P; node error codes)', (error, expected) => {
    expect(isConnectionFailure(error)).toBe(expected)
  })

  it('says "nothing was changed" only when no write can have been stored', () => {
    expect(outageMessage(undefined)).toMatch(/nothing was changed/)
    expect(outageMessage({ committed: false, uncertain: false })).toMatch(/nothing was changed/)
    expect(outageMessage({ committed: false, uncertain: true })).toMatch(/may have been saved — reload before retrying/)
    expect(outageMessage({ committed: true, uncertain: false })).toMatch(/may have been saved — reload before retrying/)
    expect(outageMessage({ committed: true, uncertain: false })).not.toMatch(/nothing was changed/)
  })
})
