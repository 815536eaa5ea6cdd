import { defineStore } from 'pinia'
import type { FitTestEntry, PreTestChecks } from '#shared/utils/fit-test-schemas'

export type CellField = 'ambientBefore' | 'ambientAfter' | 'ambientMean' | 'inMask' | 'inMaskCount'

export interface DraftState {
  version: number
  /** Text exactly as typed, so a half-typed "12." or a typo is never lost or silently changed. */
  cells: Record<string, Partial<Record<CellField, string>>>
  wholeTest: { start: string, end: string }
  mode: FitTestEntry['mode']
  seriesText: string
  seriesOffsetSeconds: number
  qualitative: FitTestEntry['qualitative']
  preTest: PreTestChecks
  respiratorSize: string
  dirty: boolean
}

function text(value: number | null | undefined) {
  return value === null || value === undefined ? '' : String(value)
}

/** A typed cell as a number: empty → null; anything that is not a number → undefined (an error to show). */
export function parseCell(raw: string | undefined): number | null | undefined {
  const trimmed = (raw ?? '').trim().replace(',', '.')
  if (trimmed === '') return null
  const value = Number(trimmed)
  return Number.isFinite(value) ? value : undefined
}

/** Drafts being typed, by test id: they outlive a page change, and autosave sends them. */
export const useFitTestDraftStore = defineStore('fit-test-drafts', {
  state: () => ({ drafts: {} as Record<string, DraftState> }),
  actions: {
    load(id: string, server: { version: number, entry: FitTestEntry, preTest: PreTestChecks, respiratorSize: string }, seriesText: string | null) {
      const local = this.drafts[id]
      // Keep local typing that has not reached the server yet, unless the server moved on.
      if (local && local.dirty && local.version === server.version) return local
      const cells: DraftState['cells'] = {}
      for (const e of server.entry.exercises) {
        cells[e.exerciseKey] = { ambientBefore: text(e.ambientBefore), ambientAfter: text(e.ambientAfter), ambientMean: text(e.ambientMean), inMask: text(e.inMask), inMaskCount: text(e.inMaskCount) }
      }
      this.drafts[id] = {
        version: server.version,
        cells,
        wholeTest: { start: text(server.entry.wholeTestAmbient?.start), end: text(server.entry.wholeTestAmbient?.end) },
        mode: server.entry.mode,
        seriesText: seriesText ?? local?.seriesText ?? '',
        seriesOffsetSeconds: server.entry.seriesOffsetSeconds ?? 0,
        qualitative: server.entry.qualitative,
        preTest: { ...server.preTest },
        respiratorSize: server.respiratorSize,
        dirty: false
      }
      return this.drafts[id]!
    },
    forget(id: string) {
      const { [id]: _finished, ...rest } = this.drafts
      this.drafts = rest
    },
    /** Every edit goes through here, so a draft always knows it has unsaved typing. */
    edit(id: string, change: (draft: DraftState) => void) {
      const draft = this.drafts[id]
      if (!draft) return
      change(draft)
      draft.dirty = true
    },
    setCell(id: string, exerciseKey: string, field: CellField, value: string) {
      this.edit(id, (d) => {
        d.cells[exerciseKey] = { ...d.cells[exerciseKey], [field]: value }
      })
    }
  }
})

/** The entry the server stores, from the typed text. Cells that are not numbers are sent as empty. */
export function entryOf(draft: DraftState, exerciseKeys: string[]): FitTestEntry {
  const num = (raw?: string) => parseCell(raw) ?? null
  return {
    mode: draft.mode,
    exercises: exerciseKeys.map(key => ({
      exerciseKey: key,
      ambientBefore: num(draft.cells[key]?.ambientBefore),
      ambientAfter: num(draft.cells[key]?.ambientAfter),
      ambientMean: num(draft.cells[key]?.ambientMean),
      inMask: num(draft.cells[key]?.inMask),
      inMaskCount: num(draft.cells[key]?.inMaskCount)
    })),
    wholeTestAmbient: draft.wholeTest.start || draft.wholeTest.end ? { start: num(draft.wholeTest.start), end: num(draft.wholeTest.end) } : null,
    seriesOffsetSeconds: draft.seriesOffsetSeconds,
    qualitative: draft.qualitative
  }
}
