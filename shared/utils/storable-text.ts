/**
 * Text that cannot be stored or shown faithfully: a NUL character (PostgreSQL refuses it in text
 * and JSON columns) or half of a UTF-16 surrogate pair (no character at all; it would be saved as
 * a replacement mark, silently changing what the person typed). Both are refused, never cleaned.
 */
const LONE_SURROGATE = /[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/

export type UnstorableReason = 'nul' | 'lone-surrogate'

export function unstorableReason(text: string): UnstorableReason | null {
  if (text.includes('\u0000')) return 'nul'
  if (LONE_SURROGATE.test(text)) return 'lone-surrogate'
  return null
}

export const UNSTORABLE_TEXT_MESSAGES: Record<UnstorableReason, string> = {
  'nul': 'This text holds an invisible NUL character (often left by a copy from another program). Retype or paste it again as plain text.',
  'lone-surrogate': 'This text holds a broken character (half of an emoji or symbol). Retype that part.'
}

export interface UnstorableText {
  /** Field path as forms name it: `notes`, `steps.2.name`; `_` for the body itself. */
  path: string
  reason: UnstorableReason
}

/** Nesting deeper than any form of ours sends; deeper input is refused rather than walked. */
export const MAX_INPUT_DEPTH = 32

/**
 * The first string (value or object key) in a parsed request that cannot be stored, or the first
 * place nested deeper than MAX_INPUT_DEPTH (`tooDeep`); null when every string can be stored.
 */
export function findUnstorableText(value: unknown): UnstorableText | { path: string, tooDeep: true } | null {
  const stack: { value: unknown, path: (string | number)[] }[] = [{ value, path: [] }]
  while (stack.length) {
    const { value: current, path } = stack.pop()!
    if (typeof current === 'string') {
      const reason = unstorableReason(current)
      if (reason) return { path: path.join('.') || '_', reason }
      continue
    }
    if (current === null || typeof current !== 'object') continue
    if (path.length >= MAX_INPUT_DEPTH) return { path: path.join('.') || '_', tooDeep: true }
    const entries: [string | number, unknown][] = Array.isArray(current) ? current.map((v, i) => [i, v]) : Object.entries(current)
    for (let i = entries.length - 1; i >= 0; i--) {
      const [key, child] = entries[i]!
      if (typeof key === 'string') {
        const reason = unstorableReason(key)
        if (reason) return { path: [...path, key].join('.'), reason }
      }
      stack.push({ value: child, path: [...path, key] })
    }
  }
  return null
}
