import { and, eq, inArray, sql } from 'drizzle-orm'
import { formatCalendarDay } from '#shared/utils/clock'
import { reminderSettingsOf, reminderStep } from '#shared/utils/oversight'
import { DUE_REASON_LABELS } from '#shared/utils/status-labels'
import type { DueListQuery } from '#shared/utils/oversight-schemas'
import type { Caller } from './auth'
import type { DueItem } from './oversight'

type Person = typeof schema.people.$inferSelect

export interface DueRow {
  personId: string
  fullName: string
  employeeNumber: string | null
  email: string | null
  siteId: string | null
  siteName: string | null
  reminderOptOut: boolean
  items: DueItem[]
  lastReminderAt: Date | null
}

/** Everyone with something due, by site, filtered. Opted-out people stay on the list. */
export async function dueList(organizationId: string, today: string, q: DueListQuery = {}): Promise<DueRow[]> {
  const p = schema.people
  const [people, standingFor, sites, lastSent] = await Promise.all([
    useDb().select().from(p).where(and(eq(p.organizationId, organizationId), eq(p.active, true))),
    loadStandings(organizationId, today),
    listSites(organizationId),
    useDb().select({ personId: schema.reminderLog.personId, sentAt: schema.reminderLog.sentAt }).from(schema.reminderLog)
      .where(and(eq(schema.reminderLog.organizationId, organizationId), eq(schema.reminderLog.kind, 'wearer')))
  ])
  const siteNames = new Map(sites.map(s => [s.id, s.name]))
  const last = new Map<string, Date>()
  for (const r of lastSent) if (r.personId && r.sentAt && (!last.get(r.personId) || last.get(r.personId)! < r.sentAt)) last.set(r.personId, r.sentAt)
  const needle = q.q?.toLowerCase()
  const rows: DueRow[] = []
  for (const person of people) {
    if (q.siteId && person.siteId !== q.siteId) continue
    if (needle && !`${person.fullName} ${person.employeeNumber ?? ''}`.toLowerCase().includes(needle)) continue
    let items = dueItemsOf(standingFor(person.id))
    if (q.reason) items = items.filter(i => i.reason === q.reason)
    if (!items.length) continue
    rows.push({ personId: person.id, fullName: person.fullName, employeeNumber: person.employeeNumber, email: person.email, siteId: person.siteId, siteName: person.siteId ? siteNames.get(person.siteId) ?? null : null, reminderOptOut: person.reminderOptOut, items, lastReminderAt: last.get(person.id) ?? null })
  }
  const urgency = (r: DueRow) => Math.min(...r.items.map(i => Object.keys(DUE_REASON_LABELS).indexOf(i.reason)))
  return rows.sort((a, b) => (a.siteName ?? '').localeCompare(b.siteName ?? '') || urgency(a) - urgency(b) || a.fullName.localeCompare(b.fullName))
}

function describeItem(item: DueItem) {
  const when = item.dueOn ? ` (${formatCalendarDay(item.dueOn)})` : ''
  return `- ${item.label}: ${DUE_REASON_LABELS[item.reason]}${when}`
}

/** The wearer's reminder: what is due, and who to ask. No medical detail, ever. */
export function wearerMessage(person: Pick<Person, 'fullName'>, organizationName: string, items: DueItem[]) {
  return {
    subject: `${organizationName}: your respirator fit test or clearance is due`,
    text: [
      `Hello ${person.fullName},`,
      '',
      `This is a reminder from ${organizationName}'s respiratory-protection program:`,
      ...items.map(describeItem),
      '',
      'Please arrange your fit test with your fit tester. A respirator may be worn only while its fit test is current — 29 CFR 1910.134(f)(2).',
      'Medical questions go to the clinic or health-care professional who evaluates you; this message holds no medical detail.'
    ].join('\n')
  }
}

export function digestMessage(organizationName: string, siteName: string, rows: DueRow[]) {
  return {
    subject: `${organizationName}: ${rows.length} ${rows.length === 1 ? 'person' : 'people'} due at ${siteName}`,
    text: [
      `Due list for ${siteName}:`,
      '',
      ...rows.flatMap(r => [`${r.fullName}${r.employeeNumber ? ` (No. ${r.employeeNumber})` : ''}${r.reminderOptOut ? ' — no e-mail reminders' : ''}`, ...r.items.map(i => `  ${describeItem(i)}`)]),
      '',
      `Open the due list: ${appUrl('/due')}`
    ].join('\n')
  }
}

type LogInsert = typeof schema.reminderLog.$inferInsert
/** Recipient of the log rows that only mark a step as news for the site digest; never mailed. */
export const DIGEST_MARKER = 'site-digest'
type Db = Database | Parameters<Parameters<Database['transaction']>[0]>[0]

/**
 * Claims a log row, then sends. A scheduled step that another instance already claimed conflicts
 * on the unique index and is skipped, so each step for each due date goes out once.
 */
async function claimAndSend(db: Db, row: LogInsert, mail: { to: string, subject: string, text: string } | null) {
  const [claimed] = await db.insert(schema.reminderLog).values(row).onConflictDoNothing().returning({ id: schema.reminderLog.id })
  if (!claimed) return false
  if (!mail) return true
  try {
    await sendMail({ organizationId: row.organizationId, ...mail })
    await db.update(schema.reminderLog).set({ sentAt: new Date() }).where(eq(schema.reminderLog.id, claimed.id))
  } catch (error) {
    await db.update(schema.reminderLog).set({ error: String((error as Error).message ?? error).slice(0, 500) }).where(eq(schema.reminderLog.id, claimed.id))
  }
  return true
}

/**
 * The daily run for one organization: each wearer's due steps, then one digest per site and
 * recipient listing the steps reached today (opted-out people included). Runs under a
 * transaction-level advisory lock per organization, so a second instance waits and then finds
 * every step already claimed; the unique indexes are the second guard.
 */
export async function runScheduledReminders(organizationId: string, today: string) {
  const org = await findOrganization(organizationId)
  const settings = reminderSettingsOf(org.settings.reminders)
  if (!settings.enabled) return { wearerMails: 0, digests: 0 }
  return useDb().transaction(async (tx) => {
    await tx.execute(sql`select pg_advisory_xact_lock(hashtext(${`sealwright-reminders:${organizationId}`}))`)
    const rows = await dueList(organizationId, today)
    let wearerMails = 0
    const news = new Map<string, DueRow[]>()
    for (const row of rows) {
      const stepped = row.items.map(i => ({ item: i, step: i.dueOn ? reminderStep(i.dueOn, today, settings) : null })).filter(x => x.step)
      let fresh = false
      for (const { item, step } of stepped) {
        const base = { organizationId, personId: row.personId, dueItem: item.dueItem, dueOn: item.dueOn!, step: step!, trigger: 'scheduled' as const }
        // The digest marker: this step is news for the site's digest once, mailed or not.
        if (await claimAndSend(tx, { ...base, recipient: DIGEST_MARKER, kind: 'digest' }, null)) fresh = true
        if (row.reminderOptOut || !row.email) continue
        if (await claimAndSend(tx, { ...base, recipient: row.email, kind: 'wearer' }, { to: row.email, ...wearerMessage(row, org.name, [item]) })) wearerMails++
      }
      if (fresh) news.set(row.siteId ?? '', [...(news.get(row.siteId ?? '') ?? []), row])
    }
    let digests = 0
    if (settings.digestRoles.length && news.size) {
      const u = schema.users
      const recipients = await tx.select({ email: u.email }).from(u)
        .where(and(eq(u.organizationId, organizationId), eq(u.active, true), inArray(u.role, settings.digestRoles)))
      for (const [siteId, siteRows] of news) {
        const siteName = siteRows[0]?.siteName ?? 'no site'
        for (const { email } of recipients) {
          const row = { organizationId, personId: null, dueItem: `digest:${siteId || 'none'}`, dueOn: today, step: 'digest', recipient: email, kind: 'digest' as const, trigger: 'scheduled' as const }
          if (await claimAndSend(tx, row, { to: email, ...digestMessage(org.name, siteName, siteRows) })) digests++
        }
      }
    }
    return { wearerMails, digests }
  })
}

/** "Remind now": one message per chosen person with everything due, logged as manual. Opted-out people are skipped and named. */
export async function remindNow(caller: Caller, personIds: string[], today: string, send: boolean) {
  const org = await findOrganization(caller.organizationId)
  const rows = (await dueList(caller.organizationId, today)).filter(r => personIds.includes(r.personId))
  const p = schema.people
  const known = await useDb().select({ id: p.id, fullName: p.fullName, email: p.email, reminderOptOut: p.reminderOptOut })
    .from(p).where(and(eq(p.organizationId, caller.organizationId), inArray(p.id, personIds)))
  if (known.length !== new Set(personIds).size) throw httpError(404, 'Some of these people are not on your roster.')
  const results = known.map((person) => {
    const row = rows.find(r => r.personId === person.id)
    const skipped = person.reminderOptOut ? 'asked for no e-mail reminders' : !person.email ? 'has no e-mail address' : !row ? 'has nothing due' : null
    return { personId: person.id, fullName: person.fullName, to: person.email, skipped, message: row ? wearerMessage(person, org.name, row.items) : null, items: row?.items ?? [] }
  })
  if (!send) return { sent: 0, results }
  let sent = 0
  for (const r of results) {
    if (r.skipped || !r.message || !r.to) continue
    const item = r.items[0]!
    await claimAndSend(useDb(), { organizationId: caller.organizationId, personId: r.personId, dueItem: item.dueItem, dueOn: item.dueOn ?? today, step: 'manual', recipient: r.to, kind: 'wearer', trigger: 'manual', sentByUserId: caller.id }, { to: r.to, ...r.message })
    sent++
  }
  return { sent, results }
}

/** The daily job across every organization, each on its own today (programToday); each organization's failure is its own. */
export async function runAllScheduledReminders() {
  const orgs = await useDb().select({ id: schema.organizations.id }).from(schema.organizations)
  let wearerMails = 0
  let digests = 0
  for (const org of orgs) {
    try {
      const r = await runScheduledReminders(org.id, await programToday(org.id))
      wearerMails += r.wearerMails
      digests += r.digests
    } catch (error) {
      console.error(`Reminders for organization ${org.id} failed:`, (error as Error).message)
    }
  }
  return { wearerMails, digests }
}
