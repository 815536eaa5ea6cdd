import { readdirSync } from 'node:fs'
import { join, relative, sep } from 'node:path'
import { fileURLToPath } from 'node:url'

export interface DiscoveredRoute {
  method: 'GET' | 'POST' | 'PATCH' | 'PUT' | 'DELETE'
  /** As the expectations tables write it: `/api/fit-tests/:id/finish`. */
  pattern: string
  /** `METHOD pattern`, the key of every expectations table. */
  key: string
  params: string[]
  /** Absolute path of the route file. */
  file: string
}

const API_DIR = fileURLToPath(new URL('../../server/api', import.meta.url))
const METHODS = ['get', 'post', 'patch', 'put', 'delete'] as const

function walk(dir: string): string[] {
  return readdirSync(dir, { withFileTypes: true }).flatMap(entry => entry.isDirectory() ? walk(join(dir, entry.name)) : [join(dir, entry.name)])
}

/**
 * Every route under server/api, read from the file names the way Nitro reads them
 * (`[id].patch.ts` → `PATCH /api/<folder>/:id`, `index.get.ts` → the folder itself), so a route
 * added tomorrow is in every generated test without anyone listing it.
 */
export function discoverRoutes(): DiscoveredRoute[] {
  const routes: DiscoveredRoute[] = []
  for (const file of walk(API_DIR)) {
    const rel = relative(API_DIR, file).split(sep).join('/')
    const match = rel.match(/^(.*)\.(get|post|patch|put|delete)\.ts$/)
    if (!match) {
      if (/\.ts$/.test(rel)) throw new Error(`server/api/${rel} has no method suffix; name it like index.get.ts.`)
      continue
    }
    const segments = match[1]!.split('/')
    if (segments[segments.length - 1] === 'index') segments.pop()
    const params: string[] = []
    const path = segments.map((s) => {
      const param = s.match(/^\[(\.\.\.)?(\w+)\]$/)
      if (!param) return s
      params.push(param[2]!)
      return `:${param[2]}`
    })
    const method = match[2]!.toUpperCase() as DiscoveredRoute['method']
    const pattern = `/api${path.length ? `/${path.join('/')}` : ''}`
    routes.push({ method, pattern, key: `${method} ${pattern}`, params, file })
  }
  return routes.sort((a, b) => a.key.localeCompare(b.key))
}

export const BODY_METHODS = new Set(['POST', 'PATCH', 'PUT'])
export { METHODS }

/** The first folder of a route under /api: the resource its `:id` names. */
export function resourceOf(route: DiscoveredRoute): string {
  return route.pattern.split('/')[2] ?? ''
}

/** The path with each `:param` replaced by `values[resource]` (ids) or `values[param]`. */
export function fillPath(route: DiscoveredRoute, values: Record<string, string | undefined>): string | null {
  let missing = false
  const path = route.pattern.replace(/:(\w+)/g, (_, param: string) => {
    const value = param === 'id' ? values[resourceOf(route)] : values[param]
    if (value === undefined) missing = true
    return encodeURIComponent(value ?? '')
  })
  return missing ? null : path
}
