import { eq } from 'drizzle-orm'
import type { Db } from '../../db/client'
import { orders, returns, shopSettings, workOrders } from '../../db/schema/index'
import { Conflict, NotFound } from '../../lib/http-errors'
import { code128Png } from '../labels/barcode'
import { createPdf, pdfBuffer } from '../labels/pdf-document'
import { shipFromOf } from '../settings/settings.service'

/**
 * The 4 × 6 in return label for the customer to print: from the customer, to the shop, the carrier
 * and service, the tracking number in type and as Code 128 (the code the packer scans to receive the
 * parcel), and the return's number and serial so the bench knows it on sight.
 */
export async function returnLabelPdf(db: Db, returnId: string): Promise<{ filename: string; pdf: Buffer }> {
  const [row] = await db
    .select({ r: returns, o: orders, serial: workOrders.serial })
    .from(returns)
    .innerJoin(orders, eq(orders.id, returns.orderId))
    .innerJoin(workOrders, eq(workOrders.id, returns.workOrderId))
    .where(eq(returns.id, returnId))
  if (!row) throw new NotFound('No such return')
  const { r, o } = row
  if (r.labelStatus !== 'bought' || !r.trackingNumber) throw new Conflict(`Return ${r.number} has no label bought yet; buy it first`)
  const [settings] = await db.select().from(shopSettings).limit(1)
  const shop = settings ? shipFromOf(settings) : null
  const lines = (a: { name: string; line1: string; line2: string | null; city: string; region: string | null; postalCode: string; country: string }) =>
    [a.name, a.line1, a.line2, `${a.city}${a.region ? `, ${a.region}` : ''} ${a.postalCode}`, a.country].filter((l): l is string => Boolean(l))
  const from = lines({ name: o.shipName, line1: o.shipLine1, line2: o.shipLine2, city: o.shipCity, region: o.shipRegion, postalCode: o.shipPostalCode, country: o.shipCountry })
  const to = shop ? lines(shop) : [settings?.shopName ?? 'The shop']
  const doc = createPdf(`Return label ${r.trackingNumber}`)
  const W = 288
  const pad = 12
  const inner = W - 2 * pad
  doc.addPage({ size: [288, 432], margin: 0 })
  doc.fillColor('#000000')
  doc.font('bold').fontSize(7).text('FROM', pad, pad)
  doc.font('body').fontSize(8)
  for (const line of from) doc.text(line, pad, doc.y, { width: inner / 2 + 20, lineBreak: false })
  doc.font('bold').fontSize(18).text('RETURN', pad + inner / 2 + 20, pad + 4, { width: inner / 2 - 20, align: 'right' })
  doc.font('body').fontSize(8).text(r.number, pad + inner / 2 + 20, pad + 28, { width: inner / 2 - 20, align: 'right' })
  doc.moveTo(0, 78).lineTo(W, 78).lineWidth(1.5).stroke()
  doc.font('bold').fontSize(8).text('SHIP TO', pad, 84)
  doc.font('bold').fontSize(13)
  for (const line of to) doc.text(line, pad, doc.y, { width: inner })
  doc.moveTo(0, 170).lineTo(W, 170).lineWidth(1.5).stroke()
  doc.font('bold').fontSize(12).text(`${r.carrier ?? ''} · ${(r.service ?? '').toUpperCase()}`, pad, 176, { width: inner })
  doc.font('body').fontSize(8).text('TRACKING', pad, 194)
  doc.image(await code128Png(r.trackingNumber, 12), pad, 204, { fit: [inner, 56], align: 'center', valign: 'center' })
  doc.font('bold').fontSize(12).text(r.trackingNumber, pad, 262, { width: inner, align: 'center' })
  doc.moveTo(0, 282).lineTo(W, 282).lineWidth(1.5).stroke()
  doc.font('body').fontSize(9).text(`Return ${r.number} · unit ${row.serial} · order ${o.number}`, pad, 292, { width: inner, align: 'center' })
  doc.font('body').fontSize(8).text('Pack the unit in its box, drained and dry, with its parts. Tape this label on the top of the box.', pad, 312, { width: inner, align: 'center' })
  return { filename: `return-label-${r.number}.pdf`, pdf: await pdfBuffer(doc) }
}
