import type { z } from 'zod'

/**
 * The submit of every form: check with the route's own zod schema first, then send; the field
 * messages from either side land beside the fields, the general one above the form.
 */
export function useFormSubmit<S extends z.ZodType>(schema: S, values: () => unknown, send: (data: z.output<S>) => Promise<unknown>) {
  const errors = ref<Record<string, string>>({})
  const message = ref('')
  const busy = ref(false)

  async function submit(): Promise<boolean> {
    message.value = ''
    const checked = validateWith(schema, values())
    errors.value = checked.errors ?? {}
    if (!checked.data) return false
    busy.value = true
    try {
      await send(checked.data)
      return true
    } catch (error) {
      const parsed = apiErrorOf(error)
      message.value = parsed.message
      errors.value = parsed.fieldErrors
      return false
    } finally {
      busy.value = false
    }
  }

  return { errors, message, busy, submit }
}
