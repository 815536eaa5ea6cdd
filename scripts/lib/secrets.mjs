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

/**
 * Passwords of the private cluster's roles: the superuser (start scripts only), the owner that
 * runs migrations, and the app's own role. Generated once into a git-ignored file, never printed.
 */
export function databasePasswords(file) {
  let kept = {}
  if (existsSync(file)) {
    try {
      kept = JSON.parse(readFileSync(file, 'utf8'))
    } catch {
      kept = {}
    }
  }
  const passwords = {}
  let changed = false
  for (const role of ['superuser', 'owner', 'app']) {
    if (typeof kept[role] === 'string' && kept[role].length >= 24) {
      passwords[role] = kept[role]
    } else {
      passwords[role] = randomBytes(24).toString('base64url')
      changed = true
    }
  }
  if (changed) {
    mkdirSync(dirname(file), { recursive: true })
    writeFileSync(file, `${JSON.stringify(passwords, null, 2)}\n`, { mode: 0o600 })
  }
  return passwords
}
