/**
 * Server logs carry ids, codes and places in the code — never names, e-mail addresses, clearance
 * data or the values a person typed. Database and parser messages often quote the offending value,
 * so quoted text and anything shaped like an e-mail address is blanked before printing.
 */
export function redactMessage(message: string): string {
  return message
    .replace(/"(?:[^"\\]|\\.)*"/g, '"…"')
    .replace(/'(?:[^'\\]|\\.)*'/g, '\'…\'')
    .replace(/\([^()]*\)=\([^()]*\)/g, '(…)=(…)')
    .replace(/[^\s@"'<>()]+@[^\s@"'<>()]+/g, '…@…')
    .slice(0, 300)
}

interface LoggableError {
  name?: unknown
  code?: unknown
  statusCode?: unknown
  constraint?: unknown
  table?: unknown
  column?: unknown
  routine?: unknown
  severity?: unknown
  message?: unknown
  stack?: unknown
  cause?: unknown
}

/** One line (plus a few code locations) describing an error by its codes, safe to keep in a log. */
export function describeError(error: unknown): string {
  const parts: string[] = []
  let current = error as LoggableError | undefined
  for (let depth = 0; current && typeof current === 'object' && depth < 4; depth++) {
    const fields: string[] = [String(current.name ?? 'Error')]
    for (const key of ['code', 'statusCode', 'constraint', 'table', 'column', 'routine'] as const) {
      if (current[key] !== undefined && current[key] !== null && current[key] !== '') fields.push(`${key}=${String(current[key])}`)
    }
    // A database error's message quotes values; its code and constraint say enough.
    const fromDatabase = typeof current.severity === 'string'
    if (!fromDatabase && typeof current.message === 'string' && current.message) fields.push(`message=${JSON.stringify(redactMessage(current.message))}`)
    parts.push(fields.join(' '))
    current = current.cause as LoggableError | undefined
  }
  const stack = typeof (error as LoggableError)?.stack === 'string' ? (error as { stack: string }).stack : ''
  const frames = stack.split('\n').filter(line => /^\s+at /.test(line)).slice(0, 4).map(line => line.trim().replace(/\(file:\/\/[^)]*\/(\.output|server|shared|node_modules)\//, '($1/'))
  return [parts.join(' <- '), ...frames.map(f => `    ${f}`)].join('\n')
}

/** Logs a server-side failure by ids and codes only. `ids` are record ids, never names. */
export function logServerError(where: string, error: unknown, ids: Record<string, string | number | undefined> = {}) {
  const idText = Object.entries(ids).filter(([, v]) => v !== undefined).map(([k, v]) => `${k}=${v}`).join(' ')
  console.error(`[sealwright] ${where}${idText ? ` ${idText}` : ''}: ${describeError(error)}`)
}
