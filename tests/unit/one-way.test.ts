/**
 * Keeps the client's one way per concern (DEVELOPERS.md "Where each concern lives"): every change
 * sent to the server goes through a `use<Area>Actions` composable, and every form submits through
 * `useFormSubmit`. Source: our own code rules (no published source).
 */
import { readdirSync, readFileSync } from 'node:fs'
import { join, relative } from 'node:path'
import { describe, expect, it } from 'vitest'

const ROOT = join(import.meta.dirname, '..', '..')
const APP = join(ROOT, 'app')

function filesUnder(dir: string): string[] {
  return readdirSync(dir, { recursive: true, encoding: 'utf8' })
    .filter(name => /\.(vue|ts)$/.test(name))
    .map(name => relative(ROOT, join(dir, name)).split('\\').join('/'))
}
const read = (file: string) => readFileSync(join(ROOT, file), 'utf8')

// The only files that may send a request with a method: one composable per concern.
const ACTIONS = /^app\/composables\/use[A-Z]\w*Actions\.ts$/
// `method: 'POST'` and the shorthand `{ method, body }` alike.
const METHOD = /\bmethod\s*:|[{,]\s*method\s*[,}]/

// A <form> that may stay without useFormSubmit, and why.
const FORMS_WITHOUT_SUBMIT: Record<string, string> = {
  'app/pages/due.vue': 'a search form whose fields filter the list as they change; it never sends anything to save'
}

describe('every mutation goes through its use<Area>Actions composable', () => {
  it('names no request method outside app/composables/use*Actions.ts', () => {
    const offenders = filesUnder(APP)
      .filter(file => !ACTIONS.test(file))
      .flatMap(file => read(file).split('\n').flatMap((line, i) => METHOD.test(line) ? [`${file}:${i + 1}: ${line.trim()}`] : []))
    expect(offenders, 'move these calls into the use<Area>Actions composable of their concern').toEqual([])
  })

  it('finds the calls it is meant to find', () => {
    // The check itself must fail on the shapes a mutation takes.
    expect(METHOD.test('await $fetch(\'/api/x\', { method: \'POST\', body })')).toBe(true)
    expect(METHOD.test('$fetch(url, { method, body })')).toBe(true)
    expect(METHOD.test('const methods = computed(() => p.method)')).toBe(false)
  })
})

describe('every form submits through useFormSubmit', () => {
  const withForms = filesUnder(APP).filter(file => file.endsWith('.vue') && /<form[\s>]/.test(read(file)))

  it('finds forms to check', () => {
    expect(withForms.length).toBeGreaterThan(20)
  })

  it.each(withForms)('%s', (file) => {
    if (file in FORMS_WITHOUT_SUBMIT) {
      // An allowed form must stay what the list says: nothing submitted, no save.
      expect(read(file)).not.toMatch(/\$fetch|use\w*Actions\(/)
      return
    }
    expect(read(file), `${file} has a <form>: submit it through useFormSubmit (app/composables/useFormSubmit.ts)`).toMatch(/\buseFormSubmit\(/)
  })

  it('keeps the allow-list to files that exist and still hold a form', () => {
    for (const file of Object.keys(FORMS_WITHOUT_SUBMIT)) expect(withForms).toContain(file)
  })
})
