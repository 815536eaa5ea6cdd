import { describe, expect, it } from 'vitest'
import { findUnstorableText, MAX_INPUT_DEPTH, unstorableReason } from '../../shared/utils/storable-text'
import { calendarDate, changesSchema, databaseInteger, pastInstant } from '../../shared/utils/input-ranges'
import { z } from 'zod'

describe('text that cannot be stored', () => {
  it.each([
    // PostgreSQL text and jsonb refuse the NUL character (PostgreSQL manual, "Character Types" and "JSON Types"; from memory).
    ['a\u0000b', 'nul', 'PostgreSQL manual, Character Types (from memory)'],
    // A high surrogate with no low one after it, or a low one with no high one before it, is no character (The Unicode Standard, §3.8 D71–D75; from memory).
    ['\ud800', 'lone-surrogate', 'Unicode §3.8 (from memory)'],
    ['x\udc00y', 'lone-surrogate', 'Unicode §3.8 (from memory)'],
    ['\udc00\ud800', 'lone-surrogate', 'reversed pair: Unicode §3.8 (from memory)'],
    ['😷', null, 'a paired surrogate is one real character: Unicode §3.8 (from memory)'],
    ['Zoë, 25 000 /cm³', null, 'plain text with accents and symbols: common practice (no published source)'],
    ['', null, 'empty text is storable: common practice (no published source)']
  ])('%j → %s (%s)', (text, reason) => {
    expect(unstorableReason(text)).toBe(reason)
  })

  it('names the first bad field by its path, keys included', () => {
    expect(findUnstorableText({ steps: [{ name: 'ok' }, { name: 'a\u0000' }] })).toEqual({ path: 'steps.1.name', reason: 'nul' })
    expect(findUnstorableText({ 'no\ud800te': 'x' })).toEqual({ path: 'no\ud800te', reason: 'lone-surrogate' })
    expect(findUnstorableText('\u0000')).toEqual({ path: '_', reason: 'nul' })
    expect(findUnstorableText({ a: [1, true, null, { b: 'fine' }] })).toBeNull()
  })

  it('stops at the depth limit instead of walking without end', () => {
    let deep: unknown = 'x'
    for (let i = 0; i < MAX_INPUT_DEPTH + 5; i++) deep = [deep]
    expect(findUnstorableText(deep)).toMatchObject({ tooDeep: true })
  })
})

describe('ranges of typed values', () => {
  const clearance = calendarDate('Give a date.', 'today')
  it.each([
    ['0000-01-01', false, 'year 0 does not exist in PostgreSQL dates: common practice (no published source)'],
    ['1899-12-31', false, 'before 1900: common practice (no published source)'],
    ['1900-01-01', true, 'the earliest accepted day'],
    ['2999-01-01', false, 'a clearance in the future cannot have happened']
  ])('clearance date %s accepted: %s (%s)', (value, ok) => {
    expect(clearance.safeParse(value).success).toBe(ok)
  })

  it('refuses an instant before 1900 or in the future, accepts one today', () => {
    const instant = pastInstant('Give a time.')
    expect(instant.safeParse('0000-01-01T00:00:00Z').success).toBe(false)
    expect(instant.safeParse(new Date(Date.now() + 3 * 86_400_000).toISOString()).success).toBe(false)
    expect(instant.safeParse(new Date().toISOString()).success).toBe(true)
  })

  it('keeps integers inside a PostgreSQL integer column (2,147,483,647: PostgreSQL manual, Numeric Types; from memory)', () => {
    expect(databaseInteger('n').safeParse(2_147_483_647).success).toBe(true)
    expect(databaseInteger('n').safeParse(2_147_483_648).success).toBe(false)
    expect(databaseInteger('n').safeParse(1e20).success).toBe(false)
  })

  it('a change schema keeps no defaults, so unnamed fields stay as saved', () => {
    const create = z.object({ name: z.string(), siteId: z.string().nullable().default(null), status: z.enum(['a', 'b']).default('a') })
    expect(create.partial().parse({ name: 'x' })).toEqual({ name: 'x', siteId: null, status: 'a' })
    expect(changesSchema(create).parse({ name: 'x' })).toEqual({ name: 'x' })
    expect(changesSchema(create).safeParse({ status: 'c' }).success).toBe(false)
  })
})
