import type { BinLabelQuery } from '@kitwright/shared/bins'
import { code128Png } from './barcode'
import { createPdf, pdfBuffer, PAPER, type PageSize } from './pdf-document'

export interface BinLabel {
  code: string
}

/** Thermal label sizes in points: 2 × 1 in and 4 × 6 in. */
const LABEL: Record<'2x1' | '4x6', PageSize> = { '2x1': [144, 72], '4x6': [288, 432] }

/** Draws one bin label in the box (x, y, w, h): the Code 128 of the code, fitted (never stretched), and the code in type. */
async function drawLabel(doc: PDFKit.PDFDocument, label: BinLabel, shopName: string, x: number, y: number, w: number, h: number) {
  const png = await code128Png(label.code)
  const large = h > 200
  const pad = large ? 18 : 5
  if (large) {
    doc.font('bold').fontSize(16).text(shopName, x + pad, y + pad, { width: w - 2 * pad, align: 'center' })
    doc.font('body').fontSize(12).text('Bin: keep every piece and part of one unit together', x + pad, y + pad + 24, { width: w - 2 * pad, align: 'center' })
    doc.image(png, x + pad, y + 90, { fit: [w - 2 * pad, 150], align: 'center', valign: 'center' })
    doc.font('bold').fontSize(48).text(label.code, x + pad, y + 260, { width: w - 2 * pad, align: 'center' })
    return
  }
  const textSize = Math.min(15, h * 0.2)
  const lineHeight = textSize * 1.25
  doc.image(png, x + pad, y + pad / 2, { fit: [w - 2 * pad, h - lineHeight - pad], align: 'center', valign: 'center' })
  // Kept inside the label: pdfkit starts a new page when a line would cross the bottom.
  doc.font('bold').fontSize(textSize).text(label.code, x, y + h - lineHeight - 1, { width: w, align: 'center', lineBreak: false })
}

/**
 * Bin labels: one per page on 2 × 1 in or 4 × 6 in thermal labels, or a Letter sheet of 2 × 1 in
 * labels (3 across, 10 down, 0.5 in margins) for an office printer.
 */
export async function binLabelsPdf(labels: readonly BinLabel[], size: BinLabelQuery['size'], shopName: string): Promise<Buffer> {
  const doc = createPdf('Bin labels')
  if (size === 'letter') {
    const [pw, ph] = PAPER.letter
    const cols = 3
    const rows = 10
    const w = (pw - 72) / cols
    const h = (ph - 72) / rows
    for (let i = 0; i < labels.length; i++) {
      if (i % (cols * rows) === 0) doc.addPage({ size: PAPER.letter, margin: 0 })
      const slot = i % (cols * rows)
      const x = 36 + (slot % cols) * w
      const y = 36 + Math.floor(slot / cols) * h
      doc.save().lineWidth(0.25).strokeColor('#bbbbbb').rect(x, y, w, h).stroke().restore()
      await drawLabel(doc, labels[i]!, shopName, x + 6, y, w - 12, h)
    }
    if (labels.length === 0) doc.addPage({ size: PAPER.letter, margin: 36 }).font('body').fontSize(14).text('No bins to print.')
  } else {
    const [w, h] = LABEL[size]
    for (const label of labels) {
      doc.addPage({ size: [w, h], margin: 0 })
      await drawLabel(doc, label, shopName, 0, 0, w, h)
    }
    if (labels.length === 0) doc.addPage({ size: [w, h], margin: 4 }).fontSize(10).text('No bins to print.')
  }
  return pdfBuffer(doc)
}
