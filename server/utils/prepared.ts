/**
 * A read the busiest routes make on every request, built once per process and sent as a named
 * statement: Drizzle does not assemble its SQL again, and PostgreSQL parses and plans it once per
 * pooled connection instead of on every request (for the fit-test record's join that planning took
 * longer than running it). Values go in through `sql.placeholder(name)` and `.execute({ name })`.
 *
 * Only for statements whose text never changes: the name must stand for one text for the life of
 * the process. Reads only; a write belongs in its transaction.
 */
export function preparedRead<T>(build: (db: Database) => T): () => T {
  let statement: T | undefined
  return () => (statement ??= build(useDb()))
}
