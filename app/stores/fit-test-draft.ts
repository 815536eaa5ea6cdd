import { defineStore } from 'pinia'
import type { FitTestEntry, PreTestChecks } from '#shared/utils/fit-test-schemas'
import type { DecimalMark, NumberReading } from '#shared/utils/number-reader'
import { readTypedNumber } from '#shared/utils/number-reader'

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
  /** The entry the server last confirmed: a refused cell sends this value, so nothing saved is lost. */
  saved: FitTestEntry
}

function text(value: number | null | undefined) {
  return value === null || value === undefined ? '' : String(value)
}

/**
 * A typed cell as the organization's one number reader reads it (DOMAIN.md "Typing numbers"),
 * plus what a concentration or a count can be: never negative, a count whole, nothing beyond a
 * counter's range. The same limits as the route's schema, so a refused cell is refused here,
 * beside the cell, and never breaks the autosave.
 */
export function readCell(raw: string | undefined, field: CellField | 'wholeTest', decimalMark: DecimalMark = 'point'): NumberReading {
  const reading = readTypedNumber(raw ?? '', { decimalMark })
  if (!reading.ok) return reading
  const refuse = (message: string): NumberReading => ({ ok: false, empty: false, message })
  if (reading.value < 0) return refuse(`'${(raw ?? '').trim()}' is negative: a ${field === 'inMaskCount' ? 'count' : 'concentration'} cannot be below zero.`)
  if (field === 'inMaskCount' && !Number.isInteger(reading.value)) return refuse(`'${(raw ?? '').trim()}' is not a whole number: a particle count is counted in whole particles.`)
  if (reading.value > 1e9) return refuse(`'${(raw ?? '').trim()}' reads as ${reading.asRead}, beyond any counter's range: check the decimal mark.`)
  return reading
}

/** A typed cell as a number: empty → null; a refused cell → undefined (its message is shown beside it). */
export function parseCell(raw: string | undefined, decimalMark: DecimalMark = 'point', field: CellField | 'wholeTest' = 'inMask'): number | null | undefined {
  const reading = readCell(raw, field, decimalMark)
  if (reading.ok) return reading.value
  return reading.empty ? null : undefined
}

/** Column names as the grid shows them. */
export const CELL_LABELS: Readonly<Record<CellField, string>> = {
  ambientBefore: 'Ambient before',
  ambientAfter: 'Ambient after',
  ambientMean: 'Ambient (mean)',
  inMask: 'In-mask',
  inMaskCount: 'In-mask count'
}

/** A cell the reader refused, named as the tester sees it: the column and the exercise. */
export interface RefusedCell {
  exerciseKey: string | null
  field: CellField | 'wholeTestStart' | 'wholeTestEnd'
  /** "In-mask for Talking: '1,5' is ambiguous: write 1.5 or 15." */
  message: string
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
        dirty: false,
        saved: server.entry
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

type Purpose = 'preview' | 'save'

/**
 * The entry from the typed text, read with the organization's decimal mark. For the preview a
 * refused cell counts as empty, so no verdict is shown while one is refused; for saving it keeps
 * the value the server last confirmed, so a typo never erases a saved reading.
 */
export function entryOf(draft: DraftState, exerciseKeys: string[], decimalMark: DecimalMark = 'point', purpose: Purpose = 'preview'): FitTestEntry {
  const savedExercise = (key: string) => draft.saved?.exercises.find(e => e.exerciseKey === key)
  const num = (raw: string | undefined, saved: number | null | undefined, field: CellField | 'wholeTest' = 'inMask') => {
    const value = parseCell(raw, decimalMark, field)
    if (value !== undefined) return value
    return purpose === 'save' ? saved ?? null : null
  }
  return {
    mode: draft.mode,
    exercises: exerciseKeys.map((key) => {
      const cells = draft.cells[key]
      const saved = savedExercise(key)
      return {
        exerciseKey: key,
        ambientBefore: num(cells?.ambientBefore, saved?.ambientBefore),
        ambientAfter: num(cells?.ambientAfter, saved?.ambientAfter),
        ambientMean: num(cells?.ambientMean, saved?.ambientMean),
        inMask: num(cells?.inMask, saved?.inMask),
        inMaskCount: num(cells?.inMaskCount, saved?.inMaskCount, 'inMaskCount')
      }
    }),
    wholeTestAmbient: draft.wholeTest.start || draft.wholeTest.end
      ? { start: num(draft.wholeTest.start, draft.saved?.wholeTestAmbient?.start), end: num(draft.wholeTest.end, draft.saved?.wholeTestAmbient?.end) }
      : null,
    seriesOffsetSeconds: draft.seriesOffsetSeconds,
    qualitative: draft.qualitative,
    decimalMark
  }
}

const CELL_FIELDS: CellField[] = ['ambientBefore', 'ambientAfter', 'ambientMean', 'inMask', 'inMaskCount']

/** Every cell the reader refuses, in grid order, each with the reader's message. */
export function refusedCells(draft: DraftState, exercises: readonly { key: string, name: string, counted: boolean }[], decimalMark: DecimalMark = 'point'): RefusedCell[] {
  const out: RefusedCell[] = []
  const check = (raw: string | undefined, exerciseKey: string | null, field: RefusedCell['field'], label: string) => {
    const reading = readCell(raw, field === 'wholeTestStart' || field === 'wholeTestEnd' ? 'wholeTest' : field, decimalMark)
    if (!reading.ok && !reading.empty) out.push({ exerciseKey, field, message: `${label}: ${reading.message}` })
  }
  if (draft.mode !== 'grid') return out
  check(draft.wholeTest.start, null, 'wholeTestStart', 'Ambient at the start')
  check(draft.wholeTest.end, null, 'wholeTestEnd', 'Ambient at the end')
  for (const exercise of exercises) {
    if (!exercise.counted) continue
    for (const field of CELL_FIELDS) check(draft.cells[exercise.key]?.[field], exercise.key, field, `${CELL_LABELS[field]} for ${exercise.name}`)
  }
  return out
}
