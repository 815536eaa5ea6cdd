// `npm run admin:create -- --email … --name … --organization …`: the first program admin of a real
// database. Creates the organization, one site and the admin account without a password, and
// prints a single-use link (valid 72 hours) where the admin sets their own password.
import { createHash, randomBytes } from 'node:crypto'
import { parseArgs } from 'node:util'
import { eq } from 'drizzle-orm'
import { z } from 'zod'
import { connect } from './seed/db'

const USAGE = `Usage:
  NUXT_DATABASE_URL=postgres://… npm run admin:create -- \\
    --email ada@example.org --name "Ada Quill" --organization "Example Works" \\
    [--rule-set us-osha|uk-hse] [--site "Main site"] [--time-zone Europe/London] [--base-url https://sealwright.example.org]`

const optionsSchema = z.object({
  'email': z.string({ error: 'Give --email, the admin\'s sign-in address.' }).trim().toLowerCase().pipe(z.email({ error: 'Give --email as a valid e-mail address.' })),
  'name': z.string({ error: 'Give --name, the admin\'s name.' }).trim().min(1, { error: 'Give --name, the admin\'s name.' }).max(120),
  'organization': z.string({ error: 'Give --organization, the program\'s name.' }).trim().min(1, { error: 'Give --organization, the program\'s name.' }).max(120),
  'rule-set': z.enum(['us-osha', 'uk-hse'], { error: 'Give --rule-set as us-osha or uk-hse.' }).default('us-osha'),
  'site': z.string().trim().min(1).max(120).default('Main site'),
  'time-zone': z.string().trim().refine((zone) => {
    try {
      new Intl.DateTimeFormat('en', { timeZone: zone })
      return true
    } catch {
      return false
    }
  }, { error: 'Give --time-zone as an IANA zone, such as Europe/London or America/Chicago.' }).default(Intl.DateTimeFormat().resolvedOptions().timeZone),
  'base-url': z.url({ error: 'Give --base-url as the address people open, such as https://sealwright.example.org.' }).optional()
})

function fail(message: string): never {
  console.error(`${message}\n\n${USAGE}`)
  process.exit(1)
}

function readArgs() {
  try {
    return parseArgs({
      options: {
        'email': { type: 'string' }, 'name': { type: 'string' }, 'organization': { type: 'string' },
        'rule-set': { type: 'string' }, 'site': { type: 'string' }, 'time-zone': { type: 'string' }, 'base-url': { type: 'string' }
      },
      strict: true
    }).values
  } catch (error) {
    fail(error instanceof Error ? error.message : String(error))
  }
}
const parsed = optionsSchema.safeParse(readArgs())
if (!parsed.success) fail(parsed.error.issues[0]!.message)
const input = parsed.data

const url = process.env.NUXT_DATABASE_URL || process.env.DATABASE_URL
if (!url) fail('Set NUXT_DATABASE_URL to the database the admin belongs to.')

const slugOf = (name: string) => name.toLowerCase().normalize('NFKD').replace(/[^a-z0-9]+/g, '-').replace(/^-|-$/g, '').slice(0, 40) || 'organization'
const { db, pool, schema } = connect(url)
try {
  const [taken] = await db.select({ id: schema.users.id }).from(schema.users).where(eq(schema.users.email, input.email))
  if (taken) fail(`An account for ${input.email} already exists; nothing was created.`)
  const token = randomBytes(32).toString('base64url')
  const created = await db.transaction(async (tx) => {
    const base = slugOf(input.organization)
    const [clash] = await tx.select({ id: schema.organizations.id }).from(schema.organizations).where(eq(schema.organizations.slug, base))
    const [org] = await tx.insert(schema.organizations).values({ name: input.organization, slug: clash ? `${base}-${randomBytes(3).toString('hex')}` : base, ruleSet: input['rule-set'] }).returning()
    await tx.insert(schema.sites).values({ organizationId: org!.id, name: input.site, timeZone: input['time-zone'] })
    const [admin] = await tx.insert(schema.users).values({ organizationId: org!.id, email: input.email, displayName: input.name, role: 'admin' }).returning()
    await tx.insert(schema.authTokens).values({
      organizationId: org!.id, userId: admin!.id, purpose: 'invitation',
      tokenHash: createHash('sha256').update(token).digest('hex'),
      expiresAt: new Date(Date.now() + 72 * 3600_000)
    })
    await tx.insert(schema.auditEvents).values({ organizationId: org!.id, actorUserId: null, entityType: 'user', entityId: admin!.id, action: 'created-from-command-line', after: { email: input.email, displayName: input.name, role: 'admin' } })
    return { org: org!, admin: admin! }
  })
  const base = (input['base-url'] ?? process.env.NUXT_PUBLIC_BASE_URL ?? `http://127.0.0.1:${process.env.SEALWRIGHT_PORT || 3000}`).replace(/\/$/, '')
  console.log(`Created ${created.org.name} (${input['rule-set']}) with the site "${input.site}" (${input['time-zone']}) and the program admin ${created.admin.email}.`)
  console.log(`\nThe admin sets a password here (single use, valid 72 hours):\n  ${base}/set-password?token=${token}\n`)
} finally {
  await pool.end()
}
