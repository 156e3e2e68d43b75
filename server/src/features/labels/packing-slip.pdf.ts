import { formatLength } from '@kitwright/shared/domain/units'
import { code128Png } from './barcode'
import { CARE_NOTES, ELECTRICAL_CAUTIONS, LOCAL_CODES } from './care-sheet'
import { createPdf, pdfBuffer, PAPER } from './pdf-document'

/** One thing in the box: a unit or a pack, with what comes with it. */
export interface SlipLine {
  title: string
  detail: string
}

export interface PackingSlip {
  shopName: string
  /** The ship-from address, which is also where returns go. */
  sender: string[]
  /** The shop's e-mail for questions and returns (reply-to, else the sender), when set. */
  contact: string | null
  orderNumber: string
  placedAt: string
  customerName: string
  shipTo: string[]
  trackingNumber: string | null
  lines: SlipLine[]
  /**
   * The parcels once the label is bought, each with its own tracking number and what is in it: one
   * section each. Empty before: `lines` is then printed as what goes in this shipment.
   */
  parcels: { position: number; of: number; trackingNumber: string | null; boxName: string; lines: SlipLine[] }[]
  backOrdered: string[]
  /** The fill line per kit revision in the parcel: depth in base units above the tote floor, and the volume. */
  fillLines: { kit: string; depth: number; litres: number }[]
  /** The parts in the box that run on mains power (e.g. the pump): the electrical cautions are printed only when there are some. */
  electricalParts: string[]
}

/**
 * The packing slip (Letter or A4): the shop's header, the order number with its Code 128, ship-to,
 * the contents with serials, and the care and safety sheet with the reservoir fill line.
 */
export async function packingSlipPdf(slip: PackingSlip, paper: 'letter' | 'a4'): Promise<Buffer> {
  const doc = createPdf(`Packing slip ${slip.orderNumber}`)
  const [pw, ph] = PAPER[paper]
  const margin = 48
  const width = pw - 2 * margin
  doc.addPage({ size: PAPER[paper], margin })
  doc
    .fillColor('#111111')
    .font('bold')
    .fontSize(22)
    .text(slip.shopName, margin, margin, { width: width - 200 })
  doc.font('body').fontSize(9.5).fillColor('#333333')
  // The sender's name is usually the shop's: print it once.
  if (slip.sender.length > 0)
    doc
      .font('bold')
      .text('Returns to', { width: width - 200 })
      .font('body')
  for (const line of slip.sender.filter((l, i) => i > 0 || l !== slip.shopName)) doc.text(line, { width: width - 200 })
  if (slip.contact) doc.text(`Questions: ${slip.contact}`, { width: width - 200 })
  doc.image(await code128Png(slip.orderNumber, 12), pw - margin - 190, margin - 6, { fit: [190, 60], align: 'center' })
  doc
    .font('bold')
    .fontSize(12)
    .fillColor('#111111')
    .text(`Order ${slip.orderNumber}`, pw - margin - 190, margin + 58, { width: 190, align: 'center' })

  doc.y = Math.max(doc.y, margin + 90)
  doc.moveDown(0.5)
  doc.font('bold').fontSize(18).text('Packing slip', margin, doc.y)
  doc
    .font('body')
    .fontSize(10)
    .fillColor('#333333')
    .text(`Placed ${slip.placedAt}${slip.trackingNumber ? ` · tracking ${slip.trackingNumber}` : ''}`)
  doc.moveDown(0.6)
  const top = doc.y
  doc.fillColor('#111111').font('bold').fontSize(11).text('Ship to', margin, top)
  doc.font('body').fontSize(11)
  for (const line of slip.shipTo) doc.text(line, margin, doc.y, { width: width / 2 - 10 })
  doc.font('bold').text('Customer', margin + width / 2, top)
  doc.font('body').text(slip.customerName, margin + width / 2, doc.y, { width: width / 2 })
  doc.y = Math.max(doc.y, top + 80)

  // One section per parcel with its own tracking number; before the label, what goes in this shipment.
  const sections =
    slip.parcels.length > 0
      ? slip.parcels.map((p) => ({
          heading: `Parcel ${p.position} of ${p.of}`,
          aside: p.trackingNumber ? `Tracking ${p.trackingNumber}` : '',
          note: p.boxName,
          lines: p.lines,
        }))
      : [{ heading: 'In this shipment', aside: '', note: 'Parcels and their tracking numbers are printed once the label is bought', lines: slip.lines }]
  for (const section of sections) {
    doc.moveDown(0.5)
    // A parcel's heading never sits alone at the foot of a page.
    if (doc.y + 60 > ph - margin) doc.addPage({ size: PAPER[paper], margin })
    const headTop = doc.y
    doc
      .font('bold')
      .fontSize(13)
      .fillColor('#111111')
      .text(section.heading, margin, headTop, { width: width / 2 })
    if (section.aside)
      doc
        .font('bold')
        .fontSize(12)
        .text(section.aside, margin + width / 2, headTop + 1, { width: width / 2, align: 'right' })
    doc.y = Math.max(doc.y, headTop + 16)
    doc
      .moveTo(margin, doc.y + 2)
      .lineTo(pw - margin, doc.y + 2)
      .lineWidth(0.75)
      .strokeColor('#999999')
      .stroke()
    doc.moveDown(0.3)
    doc.font('body').fontSize(9).fillColor('#555555').text(section.note, margin, doc.y, { width })
    doc.moveDown(0.3)
    for (const line of section.lines) {
      const y = doc.y
      doc
        .save()
        .lineWidth(0.75)
        .strokeColor('#333333')
        .rect(margin, y + 2, 9, 9)
        .stroke()
        .restore()
      doc
        .font('bold')
        .fontSize(11)
        .fillColor('#111111')
        .text(line.title, margin + 16, y, { width: width - 16 })
      doc
        .font('body')
        .fontSize(9.5)
        .fillColor('#333333')
        .text(line.detail, margin + 16, doc.y, { width: width - 16 })
      doc.moveDown(0.35)
    }
  }
  if (slip.backOrdered.length > 0) {
    doc.moveDown(0.3)
    doc
      .font('bold')
      .fontSize(11)
      .fillColor('#7c2d12')
      .text(`To follow in a later parcel: ${slip.backOrdered.join(', ')}`, margin, doc.y, { width })
  }

  // The care and safety sheet, boxed, on the same page when it fits.
  const electrical = slip.electricalParts.length > 0
  const needed = electrical ? 300 : 160
  if (doc.y + needed > ph - margin) doc.addPage({ size: PAPER[paper], margin })
  else doc.moveDown(1)
  const boxTop = doc.y
  const inner = width - 20
  const title = electrical ? 'Care and safety: read before you fill the tote and plug in the pump' : 'Care: read before you fill the tote'
  doc
    .fillColor('#7c2d12')
    .font('bold')
    .fontSize(14)
    .text(title, margin + 10, boxTop + 8, { width: inner })
  doc.moveDown(0.3)
  doc
    .fillColor('#111111')
    .font('bold')
    .fontSize(11)
    .text('Reservoir fill line', margin + 10, doc.y, { width: inner })
  doc.font('body').fontSize(10)
  if (slip.fillLines.length === 0) doc.text('No reservoir in this parcel.', margin + 10, doc.y, { width: inner })
  for (const f of slip.fillLines) {
    const gallons = f.litres / 3.785411784
    doc.text(
      `${f.kit}: fill to ${formatLength(f.depth, 'in')} (${formatLength(f.depth, 'mm')}) above the floor of the tote, ${f.litres.toFixed(1)} L (${gallons.toFixed(1)} US gal). Measure at the middle of the tote, standing level.`,
      margin + 10,
      doc.y,
      { width: inner },
    )
  }
  for (const c of CARE_NOTES) doc.text(`•  ${c}`, margin + 10, doc.y, { width: inner })
  if (electrical) {
    doc.moveDown(0.3)
    doc
      .font('bold')
      .fontSize(11)
      .fillColor('#7c2d12')
      .text(`Electricity and water (${slip.electricalParts.join(', ')})`, margin + 10, doc.y, { width: inner })
    doc.font('body').fontSize(10).fillColor('#111111')
    for (const c of ELECTRICAL_CAUTIONS) doc.text(`•  ${c}`, margin + 10, doc.y, { width: inner })
    doc.moveDown(0.3)
    doc
      .font('bold')
      .fontSize(10)
      .text(LOCAL_CODES, margin + 10, doc.y, { width: inner })
  }
  const boxBottom = doc.y + 8
  doc
    .save()
    .lineWidth(2)
    .strokeColor('#d97706')
    .rect(margin, boxTop, width, boxBottom - boxTop)
    .stroke()
    .restore()
  return pdfBuffer(doc)
}
