import { defineStore } from 'pinia'
import type { LabTextState } from '#shared/utils/lab-setup'
import type { DecimalMark } from '#shared/utils/number-reader'
import { defaultLabState } from '#shared/utils/lab-setup'

/** The training lab's set-up as typed, shared by its pages; the URL carries it for sharing. */
export const useLabStore = defineStore('training-lab', {
  state: () => ({
    setup: defaultLabState() as LabTextState,
    /** the decimal mark the set-up's numbers are written in (a shared link may bring the other one) */
    textMark: 'point' as DecimalMark,
    classroom: false,
    /** what a shared link carried that the lab could not use */
    notices: [] as string[]
  })
})
