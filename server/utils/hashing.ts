import { createHash } from 'node:crypto'

/** SHA-256 of an upload as stored, so a record shows the exact file its numbers came from. */
export function sha256OrNull(text: string | null | undefined) {
  return text ? createHash('sha256').update(text, 'utf8').digest('hex') : null
}
