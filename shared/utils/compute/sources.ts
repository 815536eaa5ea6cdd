// How a number in this module is sourced. Tests and pages show these labels beside values.
export const SOURCE_COMMON_PRACTICE = 'common practice (no published source)'
export const SOURCE_FROM_MEMORY = 'from memory'

// A rule of thumb: a value the product offers as a starting point, never as a requirement.
export interface RuleOfThumb {
  value: number
  unit: string
  label: string
  source: string
}
