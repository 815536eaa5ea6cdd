import { randomBytes } from 'node:crypto'
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs'
import { dirname } from 'node:path'

/** The session password: generated once, kept in a git-ignored file, never printed. */
export function sessionPassword(file) {
  if (existsSync(file)) {
    const kept = readFileSync(file, 'utf8').trim()
    if (kept.length >= 32) return kept
  }
  mkdirSync(dirname(file), { recursive: true })
  const fresh = randomBytes(32).toString('hex')
  writeFileSync(file, `${fresh}\n`, { mode: 0o600 })
  return fresh
}
