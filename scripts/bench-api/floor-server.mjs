// The floor for one API route: a bare Node http server that replays, on every request, the SQL
// statements the route ran during its warm-up (captured by the app's Drizzle logger), one after
// another through pg, and answers with their rows as JSON. Started by scripts/bench-api.ts.
// FLOOR_PREPARED=1 sends each as a named statement (parsed and planned once per connection), as
// the app sends its busiest reads (server/utils/prepared.ts): the stricter floor.
import http from 'node:http'
import { readFileSync } from 'node:fs'
import pg from 'pg'

const { FLOOR_DATABASE_URL, FLOOR_STATEMENTS, FLOOR_PORT, FLOOR_PREPARED } = process.env
const statements = JSON.parse(readFileSync(FLOOR_STATEMENTS, 'utf8'))
const pool = new pg.Pool({ connectionString: FLOOR_DATABASE_URL, max: 10 })

http.createServer(async (req, res) => {
  try {
    const out = []
    for (const [i, { query, params }] of statements.entries()) {
      const result = await (FLOOR_PREPARED === '1' ? pool.query({ name: `floor_${i}`, text: query, values: params }) : pool.query(query, params))
      out.push(result.rows)
    }
    const body = JSON.stringify(out)
    res.writeHead(200, { 'content-type': 'application/json' })
    res.end(body)
  } catch (error) {
    res.writeHead(500)
    res.end(String(error?.message ?? error))
  }
}).listen(Number(FLOOR_PORT), '127.0.0.1', () => process.stdout.write('ready\n'))
