import type { z } from 'zod'

export interface FormSubmitOptions {
  /**
   * What each number field could not read, by field name (FormNumberInput's `refusal`). A refused
   * field is named beside itself and nothing is sent: its value was never read, so the schema
   * cannot judge it.
   */
  refusals?: () => Record<string, string | null | undefined>
  /** The sentence above the form when a field must be fixed before anything is sent. */
  invalidMessage?: string
}

/**
 * The submit of every form: check with the route's own zod schema first, then send; the field
 * messages from either side land beside the fields, the general one above the form. Nothing the
 * person typed is touched here: a form clears its fields only inside `send`, after the save.
 */
export function useFormSubmit<S extends z.ZodType>(schema: S, values: () => unknown, send: (data: z.output<S>) => Promise<unknown>, options: FormSubmitOptions = {}) {
  const errors = ref<Record<string, string>>({})
  const message = ref('')
  const busy = ref(false)

  async function submit(): Promise<boolean> {
    if (busy.value) return false
    message.value = ''
    const refused = Object.entries(options.refusals?.() ?? {}).filter((entry): entry is [string, string] => Boolean(entry[1]))
    const checked = validateWith(schema, values())
    if (refused.length || !checked.data) {
      errors.value = { ...(checked.errors ?? {}), ...Object.fromEntries(refused) }
      message.value = options.invalidMessage ?? ''
      return false
    }
    errors.value = {}
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
