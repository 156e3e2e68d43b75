import { formatMoney } from '@kitwright/shared/money'
import { createPdf, pdfBuffer, PAPER } from './pdf-document'

export interface PurchaseOrderDocument {
  shopName: string
  /** Where the goods go: the shop's ship-from address, when set. */
  deliverTo: string[]
  /** Who the supplier writes to about it. */
  contact: string | null
  number: string
  date: string
  expectedDate: string | null
  supplier: { name: string; contactName: string | null; email: string | null; phone: string | null }
  lines: { sku: string; supplierSku: string | null; name: string; quantity: number; unitPriceCents: number }[]
  note: string | null
  totalCents: number
}

/**
 * A purchase order on Letter or A4: the shop's header and delivery address, the supplier, one row per
 * line (our SKU and theirs, quantity, unit price, line total) and the total.
 */
export async function purchaseOrderPdf(po: PurchaseOrderDocument, paper: 'letter' | 'a4'): Promise<Buffer> {
  const doc = createPdf(`Purchase order ${po.number}`)
  const [pw, ph] = PAPER[paper]
  const margin = 48
  const width = pw - 2 * margin
  doc.addPage({ size: PAPER[paper], margin })
  doc.fillColor('#111111').font('bold').fontSize(22).text(po.shopName, margin, margin, { width: width / 2 })
  doc.font('body').fontSize(9.5).fillColor('#333333')
  if (po.contact) doc.text(po.contact, { width: width / 2 })
  doc.font('bold').fontSize(18).fillColor('#111111').text(`Purchase order ${po.number}`, margin + width / 2, margin, { width: width / 2, align: 'right' })
  doc.font('body').fontSize(10).text(`Date ${po.date}`, margin + width / 2, doc.y, { width: width / 2, align: 'right' })
  if (po.expectedDate) doc.text(`Wanted by ${po.expectedDate}`, margin + width / 2, doc.y, { width: width / 2, align: 'right' })

  doc.y = Math.max(doc.y, margin + 80) + 10
  const top = doc.y
  doc.font('bold').fontSize(11).text('Supplier', margin, top)
  doc.font('body').fontSize(10.5)
  for (const line of [po.supplier.name, po.supplier.contactName, po.supplier.email, po.supplier.phone].filter((l): l is string => !!l)) doc.text(line, margin, doc.y, { width: width / 2 - 10 })
  const leftEnd = doc.y
  doc.font('bold').fontSize(11).text('Deliver to', margin + width / 2, top)
  doc.font('body').fontSize(10.5)
  const deliverTo = po.deliverTo.length > 0 ? po.deliverTo : [po.shopName]
  for (const line of deliverTo) doc.text(line, margin + width / 2, doc.y, { width: width / 2 })
  doc.y = Math.max(doc.y, leftEnd) + 16

  const cols = [
    { title: 'Our SKU', x: margin, w: 90, align: 'left' as const },
    { title: 'Your SKU', x: margin + 92, w: 80, align: 'left' as const },
    { title: 'Description', x: margin + 174, w: width - 174 - 190, align: 'left' as const },
    { title: 'Qty', x: pw - margin - 186, w: 50, align: 'right' as const },
    { title: 'Unit price', x: pw - margin - 132, w: 62, align: 'right' as const },
    { title: 'Line total', x: pw - margin - 66, w: 66, align: 'right' as const },
  ]
  const header = () => {
    const y = doc.y
    doc.font('bold').fontSize(10).fillColor('#111111')
    for (const c of cols) doc.text(c.title, c.x, y, { width: c.w, align: c.align })
    doc.moveTo(margin, y + 14).lineTo(pw - margin, y + 14).lineWidth(0.8).strokeColor('#111111').stroke()
    doc.y = y + 18
  }
  header()
  doc.font('body').fontSize(10)
  for (const l of po.lines) {
    if (doc.y + 30 > ph - margin) {
      doc.addPage({ size: PAPER[paper], margin })
      header()
      doc.font('body').fontSize(10)
    }
    const y = doc.y
    const cells = [l.sku, l.supplierSku ?? '', l.name, String(l.quantity), formatMoney(l.unitPriceCents), formatMoney(l.quantity * l.unitPriceCents)]
    let bottom = y
    cols.forEach((c, i) => {
      doc.text(cells[i] ?? '', c.x, y, { width: c.w, align: c.align })
      bottom = Math.max(bottom, doc.y)
    })
    doc.y = bottom + 4
  }
  doc.moveTo(margin, doc.y).lineTo(pw - margin, doc.y).lineWidth(0.5).strokeColor('#777777').stroke()
  doc.y += 6
  doc.font('bold').fontSize(12).text(`Total ${formatMoney(po.totalCents)}`, margin, doc.y, { width, align: 'right' })
  if (po.note) {
    doc.moveDown(1)
    doc.font('bold').fontSize(10.5).text('Note', margin, doc.y)
    doc.font('body').text(po.note, margin, doc.y, { width })
  }
  doc.moveDown(1.5)
  doc.font('body').fontSize(9.5).fillColor('#333333').text(`Please quote ${po.number} on the packing list and the invoice, and tell us if any line cannot be sent in full.`, margin, doc.y, { width })
  return pdfBuffer(doc)
}
