import { code128Png } from './barcode'
import { createPdf, pdfBuffer } from './pdf-document'

export interface OffcutLabel {
  code: string
  partSku: string
  length: string
  from: string
}

/** An offcut's 2 × 1 in label: its length in large type, the pipe, where it came from, and its Code 128. */
export async function offcutLabelPdf(label: OffcutLabel): Promise<Buffer> {
  const doc = createPdf(`Offcut ${label.code}`)
  doc.addPage({ size: [144, 72], margin: 0 })
  doc.font('bold').fontSize(18).text(label.length, 4, 3, { width: 136, align: 'center', lineBreak: false })
  doc.font('body').fontSize(7).text(`${label.partSku} offcut · ${label.from}`, 4, 23, { width: 136, align: 'center', lineBreak: false })
  doc.image(await code128Png(label.code, 8), 10, 32, { fit: [124, 28], align: 'center', valign: 'center' })
  doc.font('body').fontSize(7).text(label.code, 4, 62, { width: 136, align: 'center', lineBreak: false })
  return pdfBuffer(doc)
}
