import type { InternalApi } from 'nitropack/types'
import type { OversightImportKind } from '~/utils/oversight-csv'

/** One line of a CSV file as read on the page: its line number in the file and its fields. */
interface FileRow { line: number, values: Record<string, string> }
// The routes' own answers (both oversight imports answer alike).
type PeopleReply = InternalApi['/api/imports/people']['post']
type OversightReply = InternalApi['/api/imports/history']['post'] & InternalApi['/api/imports/clearances']['post']

const BATCH = 100

/**
 * Sends the rows a batch at a time, one request after the other, and reports each answer so the
 * page can show progress. The first refusal of a whole batch stops the run and is thrown; every
 * batch before it is saved.
 */
async function inBatches<R>(rows: FileRow[], send: (batch: FileRow[]) => Promise<R>, answered: (reply: R, batch: FileRow[]) => void) {
  for (let i = 0; i < rows.length; i += BATCH) {
    const batch = rows.slice(i, i + BATCH)
    answered(await send(batch), batch)
  }
}

/** The two CSV imports: the roster, and earlier fit tests or medical clearances. */
export function useImportActions() {
  return {
    /** A row whose employee number is already on the roster updates that person. */
    async people(rows: FileRow[], answered: (reply: PeopleReply, batch: FileRow[]) => void) {
      // A plain string address keeps the compiler out of Nitro's route-type inference for each call.
      const path: string = '/api/imports/people'
      await inBatches(rows, batch => $fetch<PeopleReply>(path, { method: 'POST', query: { firstRow: batch[0]!.line }, body: { rows: batch.map(r => r.values) } }), answered)
      await refreshNuxtData('people-list')
    },
    /** Refused rows come back numbered by their line in the file. Sending a file twice adds nothing. */
    async oversight(kind: OversightImportKind, rows: FileRow[], answered: (reply: OversightReply, batch: FileRow[]) => void) {
      const path: string = `/api/imports/${kind}`
      await inBatches(rows, batch => $fetch<OversightReply>(path, { method: 'POST', body: { rows: batch.map(r => r.values), firstRow: 1 } }), (reply, batch) => {
        // The route numbers rows from firstRow; sending 1 maps each refusal back to its line in the file.
        answered({ ...reply, errors: reply.errors.map(e => ({ ...e, row: batch[e.row - 1]?.line ?? e.row })) }, batch)
      })
      await refreshNuxtData('people-list')
    }
  }
}
