// The floor for one API route: a bare Node http server that replays, on every request, the SQL
// statements the route ran during its warm-up (captured by the app's Drizzle logger), one after
// another through pg, and answers with their rows as JSON. Started by scripts/bench-api.ts.
import http from 'node:http'
import { readFileSync } from 'node:fs'
import pg from 'pg'

const { FLOOR_DATABASE_URL, FLOOR_STATEMENTS, FLOOR_PORT } = process.env
const statements = JSON.parse(readFileSync(FLOOR_STATEMENTS, 'utf8'))
const pool = new pg.Pool({ connectionString: FLOOR_DATABASE_URL, max: 10 })

http.createServer(async (req, res) => {
  try {
    const out = []
    for (const { query, params } of statements) {
      const result = await pool.query(query, params)
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
