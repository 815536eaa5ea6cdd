import type { ReadinessTemplate } from './readiness-schemas'

// Default readiness templates seeded for every organization. The step names, order and
// tolerances are our own starting points, not taken from any instrument: a program should confirm
// each against its counter's and bench rig's documentation before relying on it.

export const DEFAULTS_NOTICE
  = 'These steps and tolerances are Sealwright defaults, not the instrument maker\'s: confirm each one with your counter\'s and bench rig\'s documentation before relying on it.'

export const DEFAULT_COUNTER_TEMPLATE: ReadinessTemplate = {
  name: 'Counter day-start (Sealwright default)',
  scope: 'counter',
  steps: [
    { name: 'Look over the counter', instruction: 'Check the case, sample tubing and power lead for damage, kinks or loose fittings.', rule: { kind: 'pass-fail' }, requiresPart: null },
    { name: 'Fluid and warm-up', instruction: 'Confirm the working fluid is topped up and the counter has finished warming up.', rule: { kind: 'pass-fail' }, requiresPart: null },
    { name: 'Filtered-air zero', instruction: 'Fit the zero filter to the sample inlet and read the concentration after one minute.', rule: { kind: 'at-most', max: 1, unit: 'particles/cm³' }, requiresPart: null },
    { name: 'Room air reading', instruction: 'Remove the zero filter and read the room air concentration.', rule: { kind: 'at-least', min: 1000, unit: 'particles/cm³' }, requiresPart: null },
    { name: 'Sample flow', instruction: 'Read the sample flow from a flow meter on the inlet.', rule: { kind: 'between', min: 90, max: 110, unit: '% of rated' }, requiresPart: null }
  ]
}

export const DEFAULT_BENCH_RIG_TEMPLATE: ReadinessTemplate = {
  name: 'Bench rig day-start (Sealwright default)',
  scope: 'bench-rig',
  steps: [
    { name: 'Counter zero through the rig line', instruction: 'With the zero filter on the rig\'s sample line, read the paired counter.', rule: { kind: 'at-most', max: 1, unit: 'particles/cm³' }, requiresPart: null },
    { name: 'Headform seated and clamped', instruction: 'Seat the headform in the hood and confirm the clamp and sample port are tight.', rule: { kind: 'pass-fail' }, requiresPart: null },
    { name: 'Hood aerosol level', instruction: 'Run the aerosol source and read the concentration in the hood (a level near 25,000 particles/cm³ is common practice, no published source).', rule: { kind: 'at-least', min: 25000, unit: 'particles/cm³' }, requiresPart: null },
    { name: 'Reference mask pressure hold', instruction: 'Fit the reference mask, draw the set negative pressure and watch the gauge for about 30 seconds; record the pressure lost.', rule: { kind: 'at-most', max: 25, unit: 'Pa' }, requiresPart: null },
    { name: 'Drink-tube line check', instruction: 'Connect the drink-tube adaptor, close it, and confirm the line holds with no bubbles or hiss.', rule: { kind: 'pass-fail' }, requiresPart: 'drinkTube' },
    { name: 'Exhalation-valve port check', instruction: 'Cap the valve port adaptor and read the leak indicator over about 30 seconds.', rule: { kind: 'at-most', max: 10, unit: 'Pa' }, requiresPart: 'exhalationValve' },
    { name: 'Hood purge', instruction: 'Stop the aerosol, purge the hood and confirm the reading falls back.', rule: { kind: 'pass-fail' }, requiresPart: null }
  ]
}

export const DEFAULT_TEMPLATES: readonly ReadinessTemplate[] = [DEFAULT_COUNTER_TEMPLATE, DEFAULT_BENCH_RIG_TEMPLATE]

/** Where a default tolerance comes from, shown beside it wherever a template is read. */
export const DEFAULT_TOLERANCE_SOURCE = 'common practice (no published source)'
export const TOLERANCE_AUTHORITY = 'Your program\'s own procedure or the instrument maker\'s instructions govern.'

/**
 * The source label of a step's tolerance: a measured step that still holds a Sealwright default
 * (same name, same rule) is "common practice (no published source)"; any other was set by the
 * program. A pass-or-fail step has no tolerance and no label.
 */
export function toleranceSource(step: { name: string, rule: { kind: string, min?: number | null, max?: number | null, unit?: string } }): string | null {
  if (step.rule.kind === 'pass-fail') return null
  const field = (rule: object, key: 'min' | 'max' | 'unit') => (rule as Record<string, unknown>)[key] ?? null
  const sameRule = (rule: object) => (['min', 'max', 'unit'] as const).every(key => field(rule, key) === field(step.rule, key))
  const same = DEFAULT_TEMPLATES.some(t => t.steps.some(d => d.name === step.name && d.rule.kind === step.rule.kind && sameRule(d.rule)))
  return same ? `Source: ${DEFAULT_TOLERANCE_SOURCE}. ${TOLERANCE_AUTHORITY}` : `Source: set by your program. ${TOLERANCE_AUTHORITY}`
}
