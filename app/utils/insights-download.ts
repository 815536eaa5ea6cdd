import type { InsightRate } from './insight-types'

/** One CSV cell: quoted when needed; a leading =, +, - or @ is prefixed so a spreadsheet never runs it. */
function csvCell(value: unknown): string {
  if (value === null || value === undefined) return ''
  let text = typeof value === 'number' ? String(value) : String(value)
  if (typeof value === 'string' && /^[=+\-@\t\r]/.test(text)) text = `'${text}`
  return /[",\n\r;]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text
}

export function toCsv(headers: string[], rows: unknown[][]): string {
  return [headers, ...rows].map(r => r.map(csvCell).join(',')).join('\r\n') + '\r\n'
}

function saveBlob(blob: Blob, fileName: string) {
  const url = URL.createObjectURL(blob)
  const a = document.createElement('a')
  a.href = url
  a.download = fileName
  document.body.appendChild(a)
  a.click()
  a.remove()
  setTimeout(() => URL.revokeObjectURL(url), 1000)
}

export function downloadCsv(fileName: string, headers: string[], rows: unknown[][]) {
  saveBlob(new Blob([toCsv(headers, rows)], { type: 'text/csv;charset=utf-8' }), fileName)
}

/** The chart's canvas as a PNG on a white background (a transparent PNG prints badly). */
export function downloadCanvasPng(canvas: HTMLCanvasElement, fileName: string) {
  const copy = document.createElement('canvas')
  copy.width = canvas.width
  copy.height = canvas.height
  const ctx = copy.getContext('2d')!
  ctx.fillStyle = '#ffffff'
  ctx.fillRect(0, 0, copy.width, copy.height)
  ctx.drawImage(canvas, 0, 0)
  copy.toBlob(blob => blob && saveBlob(blob, fileName), 'image/png')
}

export function percent(rate: number | null | undefined, digits = 0) {
  if (rate === null || rate === undefined) return '—'
  return `${(rate * 100).toFixed(digits)} %`
}

/** "72 % (61–81 %)" or, for a small group, "3 of 4 — too few tests for an interval". */
export function rateText(r: InsightRate) {
  if (r.trials === 0) return 'no tests'
  const base = `${percent(r.rate)} (${r.successes} of ${r.trials})`
  if (r.small || r.lower === null || r.upper === null) return base
  return `${base}, 95 % interval ${percent(r.lower)}–${percent(r.upper)}`
}
