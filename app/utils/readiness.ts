import type { AcceptanceRule } from '#shared/utils/compute'
import type { ReadinessStep } from '#shared/utils/readiness-schemas'
import type { StepDraft } from '~/components/readiness/ReadinessStepEditor.vue'

/** A stored step as the editor's flat draft, and back. */
export function stepToDraft(step: ReadinessStep): StepDraft {
  const r = step.rule
  return {
    name: step.name,
    instruction: step.instruction,
    kind: r.kind,
    min: 'min' in r ? r.min : null,
    max: 'max' in r ? r.max : null,
    unit: r.kind !== 'pass-fail' ? r.unit ?? '' : '',
    requiresPart: step.requiresPart
  }
}

export function draftToStep(d: StepDraft): { name: string, instruction: string, rule: Partial<AcceptanceRule> & { kind: string }, requiresPart: StepDraft['requiresPart'] } {
  const unit = d.unit.trim() || undefined
  const num = (v: number | null | string) => (v === null || v === '' ? undefined : Number(v))
  const rule = d.kind === 'pass-fail'
    ? { kind: d.kind }
    : d.kind === 'at-most'
      ? { kind: d.kind, max: num(d.max), unit }
      : d.kind === 'at-least'
        ? { kind: d.kind, min: num(d.min), unit }
        : { kind: d.kind, min: num(d.min), max: num(d.max), unit }
  return { name: d.name, instruction: d.instruction, rule: rule as Partial<AcceptanceRule> & { kind: string }, requiresPart: d.requiresPart }
}

export function blankStep(): StepDraft {
  return { name: '', instruction: '', kind: 'pass-fail', min: null, max: null, unit: '', requiresPart: null }
}
