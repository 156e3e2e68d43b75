import { formatWeightBoth } from '@kitwright/shared/domain/bag-weight'
import { code128Png } from './barcode'
import { createPdf, pdfBuffer } from './pdf-document'

export interface BagLabel {
  /** The bag's packing-list key; its Code 128 carries it. */
  itemKey: string
  serial: string
  orderNumber: string
  lines: { quantity: number; name: string; isBag: boolean }[]
  measuredMg: number
}

/** A hardware bag's 2 × 1 in label: the unit and its weight, what the bag holds, and its Code 128. */
export async function bagLabelPdf(label: BagLabel): Promise<Buffer> {
  const doc = createPdf(`Hardware bag ${label.serial}`)
  doc.addPage({ size: [144, 72], margin: 0 })
  doc.font('bold').fontSize(8).text(`${label.serial} · ${formatWeightBoth(label.measuredMg, 1)}`, 4, 3, { width: 136, align: 'center', lineBreak: false })
  const contents = label.lines.filter((l) => !l.isBag).map((l) => `${l.quantity} × ${l.name}`).join(', ')
  doc.font('body').fontSize(5.5).text(`${contents} · order ${label.orderNumber}`, 4, 13, { width: 136, height: 19, align: 'center', ellipsis: true })
  doc.image(await code128Png(label.itemKey, 8), 8, 33, { fit: [128, 27], align: 'center', valign: 'center' })
  doc.font('body').fontSize(6).text(label.itemKey, 4, 62, { width: 136, align: 'center', lineBreak: false })
  return pdfBuffer(doc)
}
