import PDFDocument from 'pdfkit'
import QRCode from 'qrcode'
import { findBuiltInProtocol, formatFitFactor } from '#shared/utils/compute'
import { COVERAGE_FLAG_TEXT } from '#shared/utils/fit-card-rules'
import type { CoverageFlag } from '#shared/utils/fit-card-rules'
import type { FitTestView } from './fit-test-view'
import { formatEventDay } from '#shared/utils/clock'

const fonts = new Map<string, Buffer>()

async function font(name: string): Promise<Buffer> {
  const kept = fonts.get(name)
  if (kept) return kept
  const raw = await useStorage('assets:fonts').getItemRaw(name)
  if (!raw) throw httpError(500, 'The card font is missing from the server build.')
  const buffer = Buffer.from(raw as ArrayBuffer)
  fonts.set(name, buffer)
  return buffer
}

export function verificationUrl(token: string) {
  return appUrl(`/verify/${token}`)
}

// One date format on every page and card (shared/utils/clock.ts): "2 Dec 2026".
function dateText(iso: string | Date, timeZone: string) {
  return formatEventDay(iso, timeZone)
}

/** What a fit card says, already worded: the layout below only places it. */
export interface FitCardContent {
  organization: string
  fields: [label: string, value: string][]
  coverage: CoverageFlag
  citation: string
  cautions: readonly string[]
  link: string
  title: string
}

export function fitCardContent(view: FitTestView, link: string): FitCardContent {
  const tz = view.site.timeZone
  const fields: [string, string][] = [
    ['Wearer', view.person?.fullName ?? ''],
    ['Respirator', `${view.respiratorMake} ${view.respiratorModel}`],
    ['Style and size', `${view.respiratorClassLabel}, size ${view.respiratorSize}`],
    ['Test', view.kind === 'qualitative' ? 'Qualitative fit test' : `Quantitative — ${findBuiltInProtocol(view.protocolKey)?.name ?? view.protocolKey}`],
    ['Overall fit factor', view.kind === 'qualitative' ? 'Qualitative pass' : `${formatFitFactor({ value: view.overallFitFactor!, isLowerBound: Boolean(view.overallIsLowerBound) })} (pass level ${view.passLevel})`],
    ['Tested on', dateText(view.performedAt, tz)],
    ['Next due', view.dueOn ? dateText(`${view.dueOn}T12:00:00Z`, 'UTC') : ''],
    ['Tester', view.testerName]
  ]
  if (view.maskUnit) fields.splice(3, 0, ['Mask unit', `Serial ${view.maskUnit.serialNumber}`])
  const citations = view.citations
  return {
    organization: view.organization.name,
    fields,
    coverage: view.coverageFlag,
    citation: citations ? `Fit tested under ${citations.fitTesting}; pass level: ${citations.passLevel}. Record kept under ${citations.record}.` : '',
    cautions: ['Valid only with the respirator, model and size above.', ...view.cautions],
    link,
    title: `Fit card — ${view.person?.fullName ?? ''}`
  }
}

const INK = '#171d22'
const MUTED = '#5a6b78'
const TIDE = '#185d5c'
const WARN = '#8a4b00'

/**
 * The card's layout on one A6 landscape page (148 × 105 mm): fields in two columns, the QR code of
 * the verification link, the readiness-check flag, the citation and the cautions. Every text box
 * has a fixed height with an ellipsis, so a long name can never push anything onto a second page.
 */
export function drawFitCard(doc: PDFKit.PDFDocument, card: FitCardContent, qr: Buffer) {
  const width = doc.page.width
  const height = doc.page.height
  const left = 16
  const right = width - 16
  doc.rect(0, 0, width, 34).fill(TIDE)
  doc.fillColor('#ffffff').font('bold').fontSize(13).text('FIT CARD', left, 11, { lineBreak: false })
  doc.font('regular').fontSize(8).text(card.organization, 110, 13, { width: right - 110, align: 'right', height: 10, ellipsis: true })

  const qrSize = 92
  const fieldsRight = right - qrSize - 10
  const columnWidth = (fieldsRight - left - 8) / 2
  // The wearer's name takes the whole first row; the other fields sit two to a row.
  const cells = card.fields.map(([label, value], i) => {
    const slot = i === 0 ? 0 : i + 1
    return { label, value, x: left + (slot % 2) * (columnWidth + 8), y: 42 + Math.floor(slot / 2) * 25, width: i === 0 ? fieldsRight - left : columnWidth }
  })
  for (const cell of cells) {
    doc.fillColor(MUTED).font('regular').fontSize(6).text(cell.label.toUpperCase(), cell.x, cell.y, { width: cell.width, height: 8, ellipsis: true, lineBreak: false })
    doc.fillColor(INK).font('bold').fontSize(8.5).text(cell.value, cell.x, cell.y + 7.5, { width: cell.width, height: 11, ellipsis: true, lineBreak: false })
  }

  doc.image(qr, right - qrSize, 40, { width: qrSize })
  doc.fillColor(MUTED).font('regular').fontSize(6).text('Scan to check this card', right - qrSize - 6, 40 + qrSize + 2, { width: qrSize + 6, align: 'center', height: 8, lineBreak: false })
  doc.fontSize(4.8).text(card.link, right - qrSize - 12, 40 + qrSize + 10, { width: qrSize + 12, align: 'center', height: 18, ellipsis: true })

  const rows = Math.ceil((card.fields.length + 1) / 2)
  const flagY = Math.max(42 + rows * 25 + 2, 40 + qrSize + 30)
  const covered = card.coverage !== 'not-covered'
  doc.lineWidth(1.2).rect(left, flagY, right - left, 20).stroke(covered ? TIDE : WARN)
  doc.fillColor(covered ? TIDE : WARN).font('bold').fontSize(7)
    .text(card.coverage === 'covered' ? 'READINESS: COVERED' : card.coverage === 'not-covered' ? 'READINESS: NOT COVERED' : 'READINESS: NOT APPLICABLE', left + 5, flagY + 6.5, { width: 110, lineBreak: false })
  const flagText = COVERAGE_FLAG_TEXT[card.coverage]
  const flagWidth = right - left - 123
  doc.fillColor(INK).font('regular').fontSize(6.5)
  const oneLine = doc.heightOfString(flagText, { width: flagWidth }) < 10
  doc.text(flagText, left + 118, flagY + (oneLine ? 6.5 : 2.5), { width: flagWidth, height: 16, ellipsis: true })

  let y = flagY + 25
  doc.fillColor(MUTED).font('regular').fontSize(5.6)
  for (const line of [card.citation, ...card.cautions].filter(Boolean)) {
    const room = height - 8 - y
    if (room < 7) break
    const boxHeight = Math.min(doc.heightOfString(line, { width: right - left }), room)
    doc.text(line, left, y, { width: right - left, height: boxHeight, ellipsis: true })
    y += boxHeight + 1.5
  }
}

/** The wearer's fit card: one A6 landscape page with the font embedded and a QR code of the verification link. */
export async function renderFitCard(view: FitTestView): Promise<Buffer> {
  const [regular, bold] = await Promise.all([font('ibm-plex-sans-latin-400-normal.woff'), font('ibm-plex-sans-latin-600-normal.woff')])
  const link = verificationUrl(view.cardToken!)
  return renderFitCardPdf(fitCardContent(view, link), { regular, bold })
}

export async function renderFitCardPdf(card: FitCardContent, fontFiles: { regular: Buffer, bold: Buffer }): Promise<Buffer> {
  const qr = await QRCode.toBuffer(card.link, { type: 'png', margin: 1, width: 240, errorCorrectionLevel: 'M' })
  // pdfkit accepts a font buffer as the default font (its types say string); passing ours keeps it
  // from loading its built-in Helvetica metrics at all. Small margins: nothing is placed by flow.
  const doc = new PDFDocument({ size: 'A6', layout: 'landscape', margins: { top: 4, bottom: 4, left: 4, right: 4 }, font: fontFiles.regular as unknown as string, info: { Title: card.title, Author: card.organization, Creator: 'Sealwright' } })
  doc.registerFont('regular', fontFiles.regular)
  doc.registerFont('bold', fontFiles.bold)
  const chunks: Buffer[] = []
  doc.on('data', (c: Buffer) => chunks.push(c))
  const done = new Promise<Buffer>(resolve => doc.on('end', () => resolve(Buffer.concat(chunks))))
  drawFitCard(doc, card, qr)
  doc.end()
  return done
}
