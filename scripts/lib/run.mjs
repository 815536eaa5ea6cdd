import { spawn, spawnSync } from 'node:child_process'

/** Runs a command to completion, output shown; resolves with its exit code. */
export function run(command, args, options = {}) {
  return new Promise((resolve) => {
    const child = spawn(command, args, { stdio: 'inherit', ...options })
    child.on('error', () => resolve(127))
    child.on('exit', code => resolve(code ?? 1))
  })
}

/** Runs a command, captures its output; never throws. */
export function capture(command, args, options = {}) {
  const result = spawnSync(command, args, { encoding: 'utf8', ...options })
  return { code: result.status ?? (result.error ? 127 : 1), stdout: result.stdout ?? '', stderr: result.stderr ?? '' }
}

export const isRoot = typeof process.getuid === 'function' && process.getuid() === 0

export function sleep(ms) {
  return new Promise(resolve => setTimeout(resolve, ms))
}

/** Polls `check` until it resolves truthy or the time runs out. */
export async function waitFor(check, { timeoutMs = 30_000, intervalMs = 250 } = {}) {
  const deadline = Date.now() + timeoutMs
  while (Date.now() < deadline) {
    try {
      if (await check()) return true
    } catch {
      // not ready yet
    }
    await sleep(intervalMs)
  }
  return false
}
