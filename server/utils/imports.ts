import { createHash } from 'node:crypto'

/** A row of an import file that was not taken, with its line and every reason. */
export interface RefusedImportRow { row: number, messages: string[] }

type Parsed<T> = { success: true, data: T } | { success: false, error: { issues: { message: string }[] } }

/**
 * Sorts the rows of an import: a row its schema refuses, or for which `check` pushes a message,
 * is refused with its line (counted from `firstRow`) and every message; what `check` returns for
 * the others is kept. `check` returns nothing when it pushed a message.
 */
export function sortImportRows<T, V>(parsed: Parsed<T>[], firstRow: number, check: (data: T, messages: string[]) => V | undefined) {
  const errors: RefusedImportRow[] = []
  const good: V[] = []
  parsed.forEach((result, i) => {
    const row = firstRow + i
    if (!result.success) {
      errors.push({ row, messages: result.error.issues.map(x => x.message) })
      return
    }
    const messages: string[] = []
    const value = check(result.data, messages)
    if (messages.length || value === undefined) errors.push({ row, messages })
    else good.push(value)
  })
  return { errors, good }
}

/** The natural key of an imported row (empty parts as empty text): the same row imported twice adds nothing. */
export function importKeyOf(parts: (string | number | null | undefined)[]) {
  return createHash('sha256').update(parts.join('|')).digest('hex')
}
