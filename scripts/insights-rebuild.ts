// `npm run insights:rebuild [-- --organization <id>]`: rebuilds the insights summary
// (insight_results, insight_drift) from the raw fit-test rows, for one organization or all. The
// running app keeps the summary in step by itself; this is for results loaded by other means, or
// to prove the summary against the raw rows. Writes to the summary wait while it runs.
import { parseArgs } from 'node:util'
import { z } from 'zod'
import { rebuildInsightFacts } from '../server/database/insight-facts'
import { connect } from './seed/db'

const url = process.env.SEALWRIGHT_DATABASE_OWNER_URL || process.env.NUXT_DATABASE_URL || process.env.DATABASE_URL
if (!url) {
  console.error('Set NUXT_DATABASE_URL (or DATABASE_URL) to the database whose insights summary to rebuild.')
  process.exit(1)
}
const { values } = parseArgs({ options: { organization: { type: 'string' } } })
const organization = z.uuid({ error: 'Give --organization as the organization\'s id (a UUID), or leave it out to rebuild every organization.' }).optional().safeParse(values.organization)
if (!organization.success) {
  console.error(organization.error.issues[0]!.message)
  process.exit(1)
}
const { db, pool } = connect(url)
const started = Date.now()
try {
  const n = await rebuildInsightFacts(db, organization.data)
  console.log(`Insights summary rebuilt: ${n.toLocaleString('en')} current results in ${((Date.now() - started) / 1000).toFixed(1)} s.`)
} finally {
  await pool.end()
}
