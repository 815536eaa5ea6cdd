import { randomBytes } from 'node:crypto'

let decoy: Promise<string> | undefined

/**
 * A password hash made with the same hasher and cost as real ones, checked when no account
 * matches, so an unknown address takes as long to refuse as a known one.
 */
export function decoyHash() {
  decoy ??= hashPassword(randomBytes(24).toString('base64url'))
  return decoy
}
