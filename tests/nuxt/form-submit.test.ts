/**
 * Forms submit through useFormSubmit: the route's field message lands beside its field, the
 * general sentence above, and nothing the person typed is lost when the server refuses.
 * Messages here are our own (no published source).
 */
import { describe, expect, it, vi } from 'vitest'
import { flushPromises } from '@vue/test-utils'
import { mountSuspended, registerEndpoint } from '@nuxt/test-utils/runtime'
import { createError, readBody } from 'h3'
import { readinessStepSchema } from '#shared/utils/readiness-schemas'
import ReviewAnswerForm from '~/components/review/ReviewAnswerForm.vue'
import ReadinessRunnerStep from '~/components/readiness/ReadinessRunnerStep.vue'

const FIT_TEST = '0b0c2f53-5d0a-4d0e-9d1e-6f1f3a0a0001'
const QUERY = '0b0c2f53-5d0a-4d0e-9d1e-6f1f3a0a0002'
const ANSWER_URL = `/api/fit-tests/${FIT_TEST}/queries/${QUERY}/answer`

describe('a migrated form (the tester\'s answer to a query)', () => {
  it('shows the server\'s field message beside the field and keeps what was typed', async () => {
    const sent: unknown[] = []
    registerEndpoint(ANSWER_URL, {
      method: 'POST',
      once: true,
      handler: async (event) => {
        sent.push(await readBody(event))
        throw createError({ statusCode: 409, statusMessage: 'Conflict', message: 'This query was answered a moment ago — reload to read it.', data: { fieldErrors: { answer: 'Answered already by another tester — reload to read it.' } } })
      }
    })
    const form = await mountSuspended(ReviewAnswerForm, { props: { fitTestId: FIT_TEST, queryId: QUERY, refreshKeys: [] } })
    const box = form.get(`#answer-${QUERY}`)
    await box.setValue('Counter CPC-7 was serviced on the 3rd; readings rechecked.')
    await form.get('form').trigger('submit')
    await vi.waitFor(() => expect(form.find(`#answer-${QUERY}-error`).exists()).toBe(true))

    expect(sent).toEqual([{ answer: 'Counter CPC-7 was serviced on the 3rd; readings rechecked.' }])
    // Beside the field, announced with it, with the non-ASCII dash intact.
    expect(form.get(`#answer-${QUERY}-error`).text()).toBe('Answered already by another tester — reload to read it.')
    expect(box.attributes('aria-invalid')).toBe('true')
    expect(box.attributes('aria-describedby')).toBe(`answer-${QUERY}-error`)
    // Nothing typed is lost, and the button is usable again.
    expect((box.element as HTMLTextAreaElement).value).toBe('Counter CPC-7 was serviced on the 3rd; readings rechecked.')
    expect(form.get('button[type="submit"]').text()).toBe('Send answer')
    expect(form.get('button[type="submit"]').attributes('disabled')).toBeUndefined()
  })

  it('checks with the route\'s own schema first and sends nothing when the answer is empty', async () => {
    const handler = vi.fn(() => ({ ok: true }))
    registerEndpoint(ANSWER_URL, { method: 'POST', once: true, handler })
    const form = await mountSuspended(ReviewAnswerForm, { props: { fitTestId: FIT_TEST, queryId: QUERY, refreshKeys: [] } })
    await form.get(`#answer-${QUERY}`).setValue('   ')
    await form.get('form').trigger('submit')
    await flushPromises()
    // answerQuerySchema: commentText('Answer', true), shared/utils/insight-schemas.ts.
    expect(form.get(`#answer-${QUERY}-error`).text()).toBe('Answer: write what needs checking.')
    expect(handler).not.toHaveBeenCalled()
  })
})

describe('a readiness step that reads a number', () => {
  const step = readinessStepSchema.parse({ name: 'Zero count', instruction: 'Fit the zero filter and read the counter.', rule: { kind: 'at-most', max: 1, unit: '/cm³' } })
  const props = (save: (value: number | boolean) => Promise<unknown>) => ({ step, index: 0, position: 1, count: 3, lastEntry: null, busy: false, error: '', save })

  it('refuses a reading it could not read, beside the field, and saves nothing', async () => {
    const save = vi.fn(async () => ({}))
    const card = await mountSuspended(ReadinessRunnerStep, { props: props(save) })
    // "1,5" with a point as the decimal mark is ambiguous (DEVELOPERS.md "Typing numbers").
    await card.get('#step-value').setValue('1,5')
    await card.get('form').trigger('submit')
    await flushPromises()
    expect(save).not.toHaveBeenCalled()
    expect(card.get('#step-value-error').text()).toContain('1,5')
    expect((card.get('#step-value').element as HTMLInputElement).value).toBe('1,5')
  })

  it('shows the route\'s refusal beside the reading and keeps the reading', async () => {
    const refusal = Object.assign(new Error('refused'), { statusCode: 400, data: { message: 'Check the request: Reading — beyond any instrument\'s range.', data: { fieldErrors: { value: 'That reading is beyond any instrument\'s range.' } } } })
    const save = vi.fn(async () => {
      throw refusal
    })
    const card = await mountSuspended(ReadinessRunnerStep, { props: props(save) })
    await card.get('#step-value').setValue('0.4')
    await card.get('form').trigger('submit')
    await flushPromises()
    expect(save).toHaveBeenCalledWith(0.4)
    expect(card.get('#step-value-error').text()).toBe('That reading is beyond any instrument\'s range.')
    expect(card.get('[role="alert"]').text()).toContain('Not saved: Check the request: Reading — beyond any instrument\'s range.')
    expect((card.get('#step-value').element as HTMLInputElement).value).toBe('0.4')
  })
})
