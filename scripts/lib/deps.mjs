// Installs npm dependencies when node_modules is missing or older than package-lock.json.
import { createHash } from 'node:crypto'
import { existsSync, readFileSync, writeFileSync } from 'node:fs'
import { join } from 'node:path'
import { log } from './log.mjs'
import { run } from './run.mjs'

export async function ensureDependencies(projectDir) {
  const lockFile = join(projectDir, 'package-lock.json')
  const stampFile = join(projectDir, 'node_modules', '.sealwright-deps')
  const want = createHash('sha256').update(readFileSync(existsSync(lockFile) ? lockFile : join(projectDir, 'package.json'))).digest('hex')
  const have = existsSync(stampFile) ? readFileSync(stampFile, 'utf8').trim() : ''
  if (have === want && existsSync(join(projectDir, 'node_modules', '.bin', 'nuxt'))) return false
  log.step(existsSync(join(projectDir, 'node_modules')) ? 'Dependencies changed: running npm ci…' : 'Installing dependencies (npm ci)…')
  const code = await run('npm', existsSync(lockFile) ? ['ci', '--no-audit', '--no-fund'] : ['install', '--no-audit', '--no-fund'], { cwd: projectDir })
  if (code !== 0) throw new Error('npm could not install the dependencies; see its messages above.')
  writeFileSync(stampFile, want)
  return true
}
