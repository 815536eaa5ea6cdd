// Installs npm dependencies when node_modules is missing or was installed from another
// package-lock.json. Every install leaves a stamp (the hash of the lock file it installed from):
// this function writes it after its own `npm ci`, and package.json's postinstall writes it after
// any `npm ci` or `npm install` run by hand or by CI, so a second `npm start` skips the install.
import { createHash } from 'node:crypto'
import { existsSync, readFileSync, writeFileSync } from 'node:fs'
import { join } from 'node:path'
import { fileURLToPath } from 'node:url'
import { log } from './log.mjs'
import { run } from './run.mjs'

function lockHash(projectDir) {
  const lockFile = join(projectDir, 'package-lock.json')
  return createHash('sha256').update(readFileSync(existsSync(lockFile) ? lockFile : join(projectDir, 'package.json'))).digest('hex')
}

const stampFile = projectDir => join(projectDir, 'node_modules', '.sealwright-deps')

/** Records that node_modules matches the current lock file. */
export function stampDependencies(projectDir) {
  if (existsSync(join(projectDir, 'node_modules'))) writeFileSync(stampFile(projectDir), lockHash(projectDir))
}

export async function ensureDependencies(projectDir) {
  const want = lockHash(projectDir)
  const have = existsSync(stampFile(projectDir)) ? readFileSync(stampFile(projectDir), 'utf8').trim() : ''
  if (have === want && existsSync(join(projectDir, 'node_modules', '.bin', 'nuxt'))) return false
  const lockFile = join(projectDir, 'package-lock.json')
  log.step(existsSync(join(projectDir, 'node_modules')) ? 'Dependencies changed: running npm ci…' : 'Installing dependencies (npm ci)…')
  const code = await run('npm', existsSync(lockFile) ? ['ci', '--no-audit', '--no-fund'] : ['install', '--no-audit', '--no-fund'], { cwd: projectDir })
  if (code !== 0) throw new Error('npm could not install the dependencies; see its messages above.')
  stampDependencies(projectDir)
  return true
}

// `node scripts/lib/deps.mjs --stamp`, run by package.json's postinstall once npm has installed.
if (process.argv[1] === fileURLToPath(import.meta.url) && process.argv.includes('--stamp')) {
  stampDependencies(fileURLToPath(new URL('../..', import.meta.url)))
}
