/**
 * PostgreSQL refusals that say something about the request, not about the server: a duplicate, a
 * value out of range, a concurrent change. Each becomes a 4xx with a sentence to act on. In every
 * case the statement failed and its transaction rolled back, so "nothing was saved" is true.
 */

interface PgError {
  code: string
  constraint?: string
}

/** The PostgreSQL error inside whatever wrapped it (drizzle wraps it in `cause`). */
function findPgError(error: unknown): PgError | null {
  let current: unknown = error
  for (let depth = 0; current && depth < 8; depth++) {
    const e = current as { code?: unknown, severity?: unknown, constraint?: string, cause?: unknown }
    if (typeof e.code === 'string' && /^[0-9A-Z]{5}$/.test(e.code) && typeof e.severity === 'string') {
      return { code: e.code, constraint: e.constraint }
    }
    current = e.cause
  }
  return null
}

/** Unique constraints by name: the field a form shows the message beside, and the message. */
const DUPLICATES: Record<string, { field: string, message: string }> = {
  users_organization_email_unique: { field: 'email', message: 'This e-mail address already has an account.' },
  people_employee_number_unique: { field: 'employeeNumber', message: 'Another person on the roster has this employee number.' },
  respirator_models_make_model_unique: { field: 'model', message: 'Your catalogue already lists this make and model.' },
  counters_serial_unique: { field: 'serialNumber', message: 'Another counter already has this serial number.' },
  bench_rigs_serial_unique: { field: 'serialNumber', message: 'Another bench rig already has this serial number.' },
  mask_types_organization_name_unique: { field: 'name', message: 'Another mask type has this name.' },
  mask_units_serial_unique: { field: 'serialNumber', message: 'Another mask unit already has this serial number.' },
  sites_organization_name_unique: { field: 'name', message: 'Another site has this name.' }
}

const CONCURRENT_CHANGE = 'Someone else changed this at the same moment, so nothing was saved. Reload to see their change, then try again.'

export function databaseRefusal(error: unknown): ReturnType<typeof httpError> | null {
  const pg = findPgError(error)
  if (!pg) return null
  const { code, constraint } = pg
  if (code === '23505') {
    const known = constraint ? DUPLICATES[constraint] : undefined
    if (known) {
      return httpError(409, `${known.message} Nothing was saved.`, { fieldErrors: { [known.field]: known.message } })
    }
    // Revision numbers, idempotency keys, card tokens: a concurrent request made the same row first.
    return httpError(409, CONCURRENT_CHANGE)
  }
  if (code === '40001' || code === '40P01' || code === '55P03') return httpError(409, CONCURRENT_CHANGE)
  if (code === '23503') return httpError(409, 'Something this refers to no longer exists or is still in use. Reload and choose again; nothing was saved.')
  if (code === '23502' || code === '23514') return httpError(400, 'A required value is missing or not allowed here; nothing was saved. Check the form and try again.')
  // Class 22: a value the column cannot hold (too long, out of range, a malformed date or number).
  if (code.startsWith('22')) return httpError(400, 'A value is outside what can be stored (too long, too large or not a real date); nothing was saved. Check the form and try again.')
  return null
}
