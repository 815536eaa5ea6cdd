import PDFDocument from 'pdfkit'
import QRCode from 'qrcode'
import { findBuiltInProtocol, formatFitFactor } from '#shared/utils/compute'
import type { FitTestView } from './fit-test-view'

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

function dateText(iso: string | Date, timeZone: string) {
  return new Intl.DateTimeFormat('en-GB', { timeZone, day: 'numeric', month: 'long', year: 'numeric' }).format(new Date(iso))
}

/** The wearer's fit card: an A6 page with the font embedded and a QR code of the verification link. */
export async function renderFitCard(view: FitTestView): Promise<Buffer> {
  const [regular, bold] = await Promise.all([font('ibm-plex-sans-latin-400-normal.woff'), font('ibm-plex-sans-latin-600-normal.woff')])
  const link = verificationUrl(view.cardToken!)
  const qr = await QRCode.toBuffer(link, { type: 'png', margin: 1, width: 240, errorCorrectionLevel: 'M' })
  // pdfkit accepts a font buffer as the default font (its types say string); passing ours keeps it
  // from loading its built-in Helvetica metrics at all.
  const doc = new PDFDocument({ size: 'A6', layout: 'landscape', margin: 22, font: regular as unknown as string, info: { Title: `Fit card — ${view.person?.fullName ?? ''}`, Author: view.organization.name, Creator: 'Sealwright' } })
  doc.registerFont('regular', regular)
  doc.registerFont('bold', bold)
  const chunks: Buffer[] = []
  doc.on('data', (c: Buffer) => chunks.push(c))
  const done = new Promise<Buffer>(resolve => doc.on('end', () => resolve(Buffer.concat(chunks))))

  const tz = view.site.timeZone
  const width = doc.page.width
  doc.rect(0, 0, width, 44).fill('#185d5c')
  doc.fillColor('#ffffff').font('bold').fontSize(15).text('FIT CARD', 22, 14)
  doc.font('regular').fontSize(9).text(view.organization.name, 120, 18, { width: width - 142, align: 'right' })

  const rows: [string, string][] = [
    ['Wearer', view.person?.fullName ?? ''],
    ['Respirator', `${view.respiratorMake} ${view.respiratorModel}`],
    ['Style and size', `${view.respiratorClassLabel}, size ${view.respiratorSize}`],
    ['Test', view.kind === 'qualitative' ? 'Qualitative fit test' : `Quantitative — ${findBuiltInProtocol(view.protocolKey)?.name ?? view.protocolKey}`],
    ['Overall fit factor', view.kind === 'qualitative' ? 'Qualitative pass' : `${formatFitFactor({ value: view.overallFitFactor!, isLowerBound: Boolean(view.overallIsLowerBound) })} (pass level ${view.passLevel})`],
    ['Tested on', dateText(view.performedAt, tz)],
    ['Next test due', view.dueOn ? dateText(`${view.dueOn}T12:00:00Z`, 'UTC') : ''],
    ['Tester', view.testerName]
  ]
  let y = 58
  for (const [label, value] of rows) {
    doc.fillColor('#5a6b78').font('regular').fontSize(7.5).text(label.toUpperCase(), 22, y)
    doc.fillColor('#171d22').font('bold').fontSize(10).text(value, 22, y + 9, { width: 250 })
    y += 26
  }
  doc.image(qr, width - 132, 60, { width: 110 })
  doc.fillColor('#37434e').font('regular').fontSize(7).text('Scan to check this card', width - 132, 174, { width: 110, align: 'center' })
  doc.fontSize(6).fillColor('#5a6b78').text(link, width - 140, 186, { width: 126, align: 'center' })
  doc.fontSize(6.5).fillColor('#5a6b78').text('A fit factor measures this face, this mask, this day; it is not a guarantee in the workplace. Valid only with the respirator, model and size above.', 22, doc.page.height - 30, { width: width - 44 })
  doc.end()
  return done
}
