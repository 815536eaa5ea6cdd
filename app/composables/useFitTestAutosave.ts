import type { Ref } from 'vue'
import type { DecimalMark } from '#shared/utils/number-reader'
import type { DraftState } from '~/stores/fit-test-draft'
import { entryOf } from '~/stores/fit-test-draft'

/** Browsers refuse keepalive bodies over 64 kB; a long pasted series is sent the ordinary way. */
const KEEPALIVE_LIMIT = 60_000

/**
 * The fit-test draft's autosave: sends the typed entry (a refused cell keeps the value the server
 * last confirmed), the pre-test checks and, in series mode, the pasted text. Every edit is also
 * copied into this tab's storage until the server confirms it, so a reload that outruns the last
 * save (or happens offline) brings the typing back.
 */
export function useFitTestAutosave(testId: string, dataKey: string, draft: DraftState, exerciseKeys: () => string[], decimalMark: Ref<DecimalMark>) {
  const actions = useFitTestActions(testId, dataKey)
  // While a kept copy is being checked against the server, nothing is sent with a version that may be stale.
  let restoring = false
  const autosave = useDraftAutosave({
    isDirty: () => draft.dirty && !restoring,
    async send(keepalive) {
      draft.dirty = false
      try {
        const entry = entryOf(draft, exerciseKeys(), decimalMark.value, 'save')
        const changes = { version: draft.version, entry, preTest: draft.preTest, seriesText: draft.mode === 'series' ? draft.seriesText : undefined }
        const saved = await actions.save(changes, keepalive && JSON.stringify(changes).length < KEEPALIVE_LIMIT)
        draft.version = saved.version
        draft.saved = entry
        if (!draft.dirty) clearDraftBackup(testId)
      } catch (error) {
        draft.dirty = true
        throw error
      }
    }
  })

  function changed() {
    writeDraftBackup(testId, draft)
    autosave.changed()
  }

  /**
   * On opening the draft: typing kept from before a reload comes back. A save sent as the page
   * closed may land just after this page read the draft, so look once more before sending the
   * copy: one version further means that save arrived, and the copy (never older) goes on top.
   */
  async function restore() {
    const copy = readDraftBackup(testId)
    if (!copy) return
    if (copy.version !== draft.version) return clearDraftBackup(testId)
    restoring = true
    Object.assign(draft, { cells: copy.cells, wholeTest: copy.wholeTest, mode: copy.mode, seriesText: copy.seriesText, seriesOffsetSeconds: copy.seriesOffsetSeconds, qualitative: copy.qualitative, preTest: copy.preTest, dirty: true })
    autosave.state.value = 'saving'
    await new Promise(resolve => setTimeout(resolve, 600))
    const fresh = await actions.currentVersion().catch(() => null)
    restoring = false
    if (fresh !== null && fresh > copy.version + 1) {
      // Saved elsewhere since: show what the server holds rather than overwrite it.
      clearDraftBackup(testId)
      window.location.reload()
      return
    }
    if (fresh !== null) draft.version = fresh
    await autosave.flush()
  }

  return { ...autosave, changed, restore }
}
