import { describe, expect, it } from 'vitest'
import tailwind from '../../tailwind.config'

// WCAG 2.2, 1.4.11 Non-text Contrast: a focus indicator needs at least 3:1 against what is next to
// it. Relative luminance and contrast ratio as WCAG 2.2 defines them ("relative luminance").
function luminance(hex: string) {
  const [r, g, b] = [1, 3, 5].map(i => Number.parseInt(hex.slice(i, i + 2), 16) / 255)
    .map(c => (c <= 0.04045 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4))
  return 0.2126 * r! + 0.7152 * g! + 0.0722 * b!
}
function contrast(a: string, b: string) {
  const [hi, lo] = [luminance(a), luminance(b)].sort((x, y) => y - x)
  return (hi! + 0.05) / (lo! + 0.05)
}

const colors = tailwind.theme.extend.colors
const WHITE = '#ffffff'

describe('focus rings are at least 3:1 against what surrounds them', () => {
  it.each([
    ['light pages: tide-700 ring on white', colors.tide[700], WHITE],
    ['light pages: tide-700 ring on the page background ink-50', colors.tide[700], colors.ink[50]],
    ['form fields: tide-700 ring on white fields', colors.tide[700], WHITE],
    ['dark side panel: white ring on tide-900', WHITE, colors.tide[900]],
    ['dark side panel: white ring on the current item, tide-800', WHITE, colors.tide[800]]
  ])('%s', (_, ring, surface) => {
    expect(contrast(ring, surface)).toBeGreaterThanOrEqual(3)
  })

  it('would have caught the old side-panel ring (tide-600 on tide-900 is under 3:1)', () => {
    expect(contrast(colors.tide[600], colors.tide[900])).toBeLessThan(3)
  })
})
