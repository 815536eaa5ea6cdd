import type { PassLevelRuleSetKey } from '#shared/utils/compute'
import { evaluateExposureAssessment } from '#shared/utils/compute/exposure-assessment'
import { emptySubstance, readCalculatorDraft } from '#shared/utils/exposure-draft'
import type { CalculatorDraft } from '#shared/utils/exposure-draft'

export interface CalculatorMeta {
  // The draft assessment being edited, when the calculator was opened from one.
  editingId: string | null
  version: number | null
  title: string
  siteId: string
  chosenClassKeys: string[]
  rationale: string
}

/**
 * The calculator as typed, kept across pages so nothing typed is lost on a visit elsewhere, and
 * its result computed in the browser with the same module the server uses.
 */
export function useCalculator(ruleSet: Ref<PassLevelRuleSetKey>) {
  const draft = useState<CalculatorDraft>('calculator-draft', () => ({ contaminants: [emptySubstance()], additiveMixture: true, oxygenDeficient: false }))
  const meta = useState<CalculatorMeta>('calculator-meta', () => ({ editingId: null, version: null, title: '', siteId: '', chosenClassKeys: [], rationale: '' }))
  const decimalMark = useDecimalMark()
  const read = computed(() => readCalculatorDraft(draft.value, decimalMark.value))
  const evaluation = computed(() => evaluateExposureAssessment({ ruleSet: ruleSet.value, ...read.value.input }))
  // Empty fields are not called missing until the user asks for a save: a fresh form is not an error.
  const showMissing = useState('calculator-show-missing', () => false)
  const errors = computed(() => {
    const out: Record<string, string> = { ...read.value.readErrors }
    for (const issue of evaluation.value.issues) {
      if (issue.severity !== 'error' || !issue.field) continue
      if (issue.code === 'missing' && !showMissing.value) continue
      out[issue.field] ??= issue.message
    }
    return out
  })
  const warnings = computed(() => evaluation.value.issues.filter(i => i.severity === 'warning'))
  const result = computed(() => Object.keys(read.value.readErrors).length === 0 && evaluation.value.ok ? evaluation.value.value : null)

  function reset() {
    showMissing.value = false
    draft.value = { contaminants: [emptySubstance()], additiveMixture: true, oxygenDeficient: false }
    meta.value = { editingId: null, version: null, title: '', siteId: '', chosenClassKeys: [], rationale: '' }
  }

  return { draft, meta, read, errors, warnings, result, reset, showMissing, decimalMark }
}
