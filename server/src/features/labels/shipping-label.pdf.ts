import bwipjs from 'bwip-js/node'
import { formatSscc, ssccElementString } from '@kitwright/shared/domain/gs1'
import { code128Png } from './barcode'
import { createPdf, pdfBuffer } from './pdf-document'

export interface ShippingLabel {
  from: string[]
  to: string[]
  carrier: string
  service: string
  trackingNumber: string
  routingCode: string
  orderNumber: string
  companyPrefixLength: number
  /** Each parcel's own tracking number (labels bought before each parcel had one print the shipment's). */
  parcels: { sscc: string; weight: string; contents: string; trackingNumber?: string | null }[]
}

/**
 * An SSCC as GS1-128 with application identifier (00): bwip-js's `gs1-128` takes the element string
 * `(00)` + 18 digits and adds the FNC1 itself. White background and a quiet zone, so decoders read it.
 */
export function ssccBarcodePng(ssccDigits: string): Promise<Buffer> {
  return bwipjs.toBuffer({ bcid: 'gs1-128', text: ssccElementString(ssccDigits), scale: 4, height: 18, includetext: false, backgroundcolor: 'FFFFFF', padding: 10 })
}

/**
 * The 4 × 6 in shipping label, one page per parcel: ship-from, ship-to, carrier and service, the
 * parcel's own tracking number (in type and as Code 128), and the parcel's SSCC-18 in GS1-128 with AI (00).
 */
export async function shippingLabelPdf(label: ShippingLabel): Promise<Buffer> {
  const doc = createPdf(`Shipping label ${label.trackingNumber}`)
  const W = 288
  const pad = 12
  const inner = W - 2 * pad
  for (const [i, parcel] of label.parcels.entries()) {
    const number = parcel.trackingNumber ?? label.trackingNumber
    const tracking = await code128Png(number, 12)
    doc.addPage({ size: [288, 432], margin: 0 })
    doc.fillColor('#000000')
    doc.font('bold').fontSize(7).text('FROM', pad, pad)
    doc.font('body').fontSize(8)
    for (const line of label.from) doc.text(line, pad, doc.y, { width: inner / 2 + 20, lineBreak: false })
    doc.font('bold').fontSize(16).text(label.routingCode, pad + inner / 2 + 20, pad + 4, { width: inner / 2 - 20, align: 'right' })
    doc.font('body').fontSize(8).text(`Parcel ${i + 1} of ${label.parcels.length}`, pad + inner / 2 + 20, pad + 26, { width: inner / 2 - 20, align: 'right' })
    doc.text(parcel.weight, pad + inner / 2 + 20, doc.y, { width: inner / 2 - 20, align: 'right' })
    doc.moveTo(0, 78).lineTo(W, 78).lineWidth(1.5).stroke()

    doc.font('bold').fontSize(8).text('SHIP TO', pad, 84)
    doc.font('bold').fontSize(13)
    for (const line of label.to) doc.text(line, pad, doc.y, { width: inner })
    doc.moveTo(0, 170).lineTo(W, 170).lineWidth(1.5).stroke()

    doc.font('bold').fontSize(12).text(`${label.carrier} · ${label.service.toUpperCase()}`, pad, 176, { width: inner })
    doc.font('body').fontSize(8).text('TRACKING', pad, 194)
    doc.image(tracking, pad, 204, { fit: [inner, 56], align: 'center', valign: 'center' })
    doc.font('bold').fontSize(12).text(number, pad, 262, { width: inner, align: 'center' })
    doc.moveTo(0, 282).lineTo(W, 282).lineWidth(1.5).stroke()

    doc.font('body').fontSize(8).text('SSCC', pad, 287)
    doc.image(await ssccBarcodePng(parcel.sscc), pad, 297, { fit: [inner, 92], align: 'center', valign: 'center' })
    doc.font('bold').fontSize(10).text(`(00) ${formatSscc(parcel.sscc, label.companyPrefixLength)}`, pad, 392, { width: inner, align: 'center' })
    doc.font('body').fontSize(7).text(`Order ${label.orderNumber} · ${parcel.contents}`, pad, 410, { width: inner, align: 'center', lineBreak: false })
  }
  return pdfBuffer(doc)
}
