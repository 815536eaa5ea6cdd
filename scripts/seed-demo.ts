// `tsx scripts/seed-demo.ts`: loads the demo scenario into DATABASE_URL when it holds no organization yet.
import { connect } from './seed/db'
import { seedDemo } from './seed/demo'
import { isEmpty } from './lib/database.mjs'

const url = process.env.DATABASE_URL || process.env.NUXT_DATABASE_URL
if (!url) {
  console.error('Set DATABASE_URL to the database to load the demo scenario into.')
  process.exit(1)
}
if (!(await isEmpty(url)) && !process.argv.includes('--force')) {
  console.log('The database already holds data: demo scenario not loaded again.')
  process.exit(0)
}
const { db, pool } = connect(url)
const started = Date.now()
try {
  await seedDemo(db, text => console.log(`  · ${text}`))
  console.log(`Demo scenario loaded in ${((Date.now() - started) / 1000).toFixed(1)} s.`)
} finally {
  await pool.end()
}
