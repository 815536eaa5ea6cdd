import type { Ref } from 'vue'
import type { DecimalMark } from '#shared/utils/number-reader'
import type { DraftState } from '~/stores/fit-test-draft'
import { entryOf } from '~/stores/fit-test-draft'

/** Browsers refuse keepalive bodies over 64 kB; a long pasted series is sent the ordinary way. */
const KEEPALIVE_LIMIT = 60_000

/**
 * The fit-test draft's autosave: sends the typed entry (a refused cell keeps the value the server
 * last confirmed), the pre-test checks and, in series mode, the pasted text.
 */
export function useFitTestAutosave(testId: string, dataKey: string, draft: DraftState, exerciseKeys: () => string[], decimalMark: Ref<DecimalMark>) {
  const actions = useFitTestActions(testId, dataKey)
  return useDraftAutosave({
    isDirty: () => draft.dirty,
    async send(keepalive) {
      draft.dirty = false
      try {
        const entry = entryOf(draft, exerciseKeys(), decimalMark.value, 'save')
        const changes = { version: draft.version, entry, preTest: draft.preTest, seriesText: draft.mode === 'series' ? draft.seriesText : undefined }
        const saved = await actions.save(changes, keepalive && JSON.stringify(changes).length < KEEPALIVE_LIMIT)
        draft.version = saved.version
        draft.saved = entry
      } catch (error) {
        draft.dirty = true
        throw error
      }
    }
  })
}
