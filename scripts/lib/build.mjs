// Builds the app only when a source file changed since the last build.
import { createHash } from 'node:crypto'
import { existsSync, readdirSync, readFileSync, statSync, writeFileSync } from 'node:fs'
import { join, relative } from 'node:path'
import { log } from './log.mjs'
import { run } from './run.mjs'

const INPUTS = ['app', 'server', 'shared', 'public', 'nuxt.config.ts', 'tailwind.config.ts', 'package-lock.json', 'tsconfig.json']

function walk(dir, out) {
  for (const entry of readdirSync(dir, { withFileTypes: true })) {
    const path = join(dir, entry.name)
    if (entry.isDirectory()) walk(path, out)
    else out.push(path)
  }
}

export function sourceFingerprint(projectDir) {
  const files = []
  for (const input of INPUTS) {
    const path = join(projectDir, input)
    if (!existsSync(path)) continue
    if (statSync(path).isDirectory()) walk(path, files)
    else files.push(path)
  }
  const hash = createHash('sha256')
  for (const file of files.sort()) {
    hash.update(relative(projectDir, file)).update('\0').update(readFileSync(file)).update('\0')
  }
  return hash.digest('hex')
}

export async function ensureBuild(projectDir) {
  const stamp = join(projectDir, '.output', '.sealwright-build')
  const want = sourceFingerprint(projectDir)
  if (existsSync(stamp) && readFileSync(stamp, 'utf8').trim() === want && existsSync(join(projectDir, '.output', 'server', 'index.mjs'))) {
    return false
  }
  log.step('Building the app (nuxt build)…')
  const code = await run(join(projectDir, 'node_modules', '.bin', 'nuxt'), ['build'], { cwd: projectDir })
  if (code !== 0) throw new Error('nuxt build failed; see its messages above.')
  writeFileSync(stamp, want)
  return true
}
