import type { DraftState } from '~/stores/fit-test-draft'

/** What the tester typed, kept in this tab until the server confirms it (a reload can outrun the last save). */
export type DraftBackup = Pick<DraftState, 'version' | 'cells' | 'wholeTest' | 'mode' | 'seriesText' | 'seriesOffsetSeconds' | 'qualitative' | 'preTest'>

const keyOf = (id: string) => `sealwright-draft-${id}`

export function writeDraftBackup(id: string, draft: DraftState) {
  const { version, cells, wholeTest, mode, seriesText, seriesOffsetSeconds, qualitative, preTest } = draft
  try {
    sessionStorage.setItem(keyOf(id), JSON.stringify({ version, cells, wholeTest, mode, seriesText, seriesOffsetSeconds, qualitative, preTest }))
  } catch {
    // Storage full or refused: the autosave still runs; only the reload safety net is missing.
  }
}

export function readDraftBackup(id: string): DraftBackup | null {
  try {
    const text = sessionStorage.getItem(keyOf(id))
    return text ? JSON.parse(text) as DraftBackup : null
  } catch {
    return null
  }
}

export function clearDraftBackup(id: string) {
  try {
    sessionStorage.removeItem(keyOf(id))
  } catch {
    // Nothing to clear.
  }
}
