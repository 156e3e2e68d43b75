import { countryName, formatHsCode, type CustomsForm } from '@kitwright/shared/customs'
import type { CustomsDeclaration } from '@kitwright/shared/domain/customs'
import { createPdf, pdfBuffer } from './pdf-document'

export interface CustomsDeclarationInput {
  sender: string[]
  senderCountry: string
  addressee: string[]
  addresseeCountry: string
  orderNumber: string
  /** ISO 4217 code of the order's prices. */
  currency: string
  carrier: string
  /** The day it is printed, YYYY-MM-DD. */
  date: string
  parcels: {
    position: number
    of: number
    trackingNumber: string
    form: CustomsForm
    /** The parcel's recorded weight (scale reading, else the estimate), grams. */
    grossGrams: number
    declaration: CustomsDeclaration
  }[]
}

/** The categories a UPU declaration offers; Kitwright ships sold goods. */
const CATEGORIES = ['Sale of goods', 'Gift', 'Documents', 'Commercial sample', 'Returned goods', 'Other'] as const

const W = 288
const H = 432
const PAD = 10
const INNER = W - 2 * PAD
/** Columns of the contents table: x offset from PAD and width. */
const COLS = {
  description: { x: 0, w: 96 },
  quantity: { x: 96, w: 22 },
  net: { x: 118, w: 36 },
  value: { x: 154, w: 44 },
  hs: { x: 198, w: 48 },
  origin: { x: 246, w: 22 },
} as const

const kg = (grams: number) => (grams / 1000).toFixed(3)
const money = (cents: number) => (cents / 100).toFixed(2)

/**
 * The customs declaration of a shipment abroad, Kitwright's own layout on the UPU CN 22 / CN 23
 * model: one declaration per parcel on 4 × 6 in pages (the label printer's), each with sender and
 * addressee, the category (sale of goods), per part its description, quantity, net weight, value,
 * HS tariff number and country of origin, the totals, and the sender's declaration with date and
 * signature line. A parcel with more lines than a page holds continues on the next page.
 */
export async function customsDeclarationPdf(input: CustomsDeclarationInput): Promise<Buffer> {
  const doc = createPdf(`Customs declaration ${input.orderNumber}`)
  for (const parcel of input.parcels) {
    const d = parcel.declaration
    let page = 1
    const header = (continued: boolean) => {
      doc.addPage({ size: [W, H], margin: 0 })
      doc.fillColor('#000000')
      doc.font('bold').fontSize(12).text('CUSTOMS DECLARATION', PAD, PAD, { width: INNER - 60, lineBreak: false })
      doc.font('bold').fontSize(18).text(parcel.form, W - PAD - 70, PAD - 3, { width: 70, align: 'right', lineBreak: false })
      doc.font('body').fontSize(7).text(
        `May be opened officially · Parcel ${parcel.position} of ${parcel.of}${continued ? ` · continued, page ${page}` : ''}`,
        PAD,
        PAD + 15,
        { width: INNER - 60, lineBreak: false },
      )
      doc.text(`${input.carrier ? `${input.carrier} · ` : ''}tracking ${parcel.trackingNumber}`, PAD, PAD + 24, { width: INNER, lineBreak: false })
      doc.moveTo(0, 44).lineTo(W, 44).lineWidth(1).stroke()
    }
    header(false)

    // Sender and addressee side by side.
    const half = INNER / 2
    doc.font('bold').fontSize(6.5).text('FROM (SENDER)', PAD, 48)
    doc.text('TO (ADDRESSEE)', PAD + half + 4, 48)
    doc.font('body').fontSize(7.5)
    let y = 57
    for (const line of input.sender) {
      doc.text(line, PAD, y, { width: half - 4, lineBreak: false })
      y += 9
    }
    doc.text(countryName(input.senderCountry), PAD, y, { width: half - 4, lineBreak: false })
    let y2 = 57
    for (const line of input.addressee) {
      doc.text(line, PAD + half + 4, y2, { width: half - 4, lineBreak: false })
      y2 += 9
    }
    doc.font('bold').text(countryName(input.addresseeCountry).toUpperCase(), PAD + half + 4, y2, { width: half - 4, lineBreak: false })
    y = Math.max(y, y2) + 12
    doc.moveTo(PAD + half, 46).lineTo(PAD + half, y - 2).lineWidth(0.5).stroke()
    doc.moveTo(0, y).lineTo(W, y).lineWidth(1).stroke()

    // Category of item: sale of goods.
    y += 4
    doc.font('bold').fontSize(6.5).text('CATEGORY OF ITEM', PAD, y)
    y += 9
    let x = PAD
    doc.font('body').fontSize(7)
    for (const c of CATEGORIES) {
      const w = doc.widthOfString(c) + 14
      if (x + w > W - PAD) {
        x = PAD
        y += 10
      }
      doc.rect(x, y, 7, 7).lineWidth(0.6).stroke()
      if (c === 'Sale of goods') doc.moveTo(x + 1, y + 1).lineTo(x + 6, y + 6).moveTo(x + 6, y + 1).lineTo(x + 1, y + 6).lineWidth(1).stroke()
      doc.text(c, x + 9, y, { lineBreak: false })
      x += w + 4
    }
    y += 12
    doc.moveTo(0, y).lineTo(W, y).lineWidth(1).stroke()

    // The contents table.
    const tableHead = (top: number) => {
      doc.font('bold').fontSize(6)
      const head: [keyof typeof COLS, string][] = [
        ['description', 'Detailed description of contents'],
        ['quantity', 'Qty'],
        ['net', 'Net weight (kg)'],
        ['value', `Value (${input.currency})`],
        ['hs', 'HS tariff number'],
        ['origin', 'Origin'],
      ]
      for (const [k, label] of head) doc.text(label, PAD + COLS[k].x, top, { width: COLS[k].w - 2, align: k === 'description' ? 'left' : 'right' })
      const bottom = top + 16
      doc.moveTo(PAD, bottom).lineTo(W - PAD, bottom).lineWidth(0.5).stroke()
      return bottom + 2
    }
    y = tableHead(y + 3)
    // Room kept at the foot of the last page for the totals and the declaration.
    const foot = 128
    for (const [i, line] of d.lines.entries()) {
      doc.font('body').fontSize(7)
      const text = line.description
      const h = Math.max(9, doc.heightOfString(text, { width: COLS.description.w - 2 })) + 9
      const last = i === d.lines.length - 1
      if (y + h > H - (last ? foot : 16)) {
        doc.font('body').fontSize(6.5).text('Continued on the next page', PAD, H - 14, { width: INNER, align: 'right' })
        page += 1
        header(true)
        y = tableHead(50)
        doc.font('body').fontSize(7)
      }
      doc.text(text, PAD + COLS.description.x, y, { width: COLS.description.w - 2 })
      doc.fontSize(5.5).fillColor('#444444').text(`SKU ${line.sku}`, PAD + COLS.description.x, doc.y, { width: COLS.description.w - 2, lineBreak: false }).fillColor('#000000').fontSize(7)
      const cell = (k: keyof typeof COLS, v: string) => doc.text(v, PAD + COLS[k].x, y, { width: COLS[k].w - 2, align: 'right', lineBreak: false })
      cell('quantity', String(line.quantity))
      cell('net', kg(line.netGrams))
      cell('value', money(line.valueCents))
      cell('hs', line.hsCode ? formatHsCode(line.hsCode) : '')
      cell('origin', line.originCountry ?? '')
      y += h
      doc.moveTo(PAD, y - 1).lineTo(W - PAD, y - 1).lineWidth(0.25).strokeColor('#888888').stroke().strokeColor('#000000')
    }
    if (y > H - foot) {
      page += 1
      header(true)
      y = 50
    }

    // Totals.
    y += 2
    doc.moveTo(PAD, y).lineTo(W - PAD, y).lineWidth(1).stroke()
    y += 3
    doc.font('bold').fontSize(7.5).text('Total', PAD, y, { width: COLS.quantity.x - 2 })
    doc.text(kg(d.totalNetGrams), PAD + COLS.net.x, y, { width: COLS.net.w - 2, align: 'right', lineBreak: false })
    doc.text(money(d.totalValueCents), PAD + COLS.value.x, y, { width: COLS.value.w - 2, align: 'right', lineBreak: false })
    y += 11
    doc.font('body').fontSize(7)
    doc.text(`Total gross weight (parcel): ${kg(parcel.grossGrams)} kg · Total value: ${input.currency} ${money(d.totalValueCents)}`, PAD, y, { width: INNER })
    y = doc.y + 2
    doc.text(
      `Invoice: order ${input.orderNumber}. Licence, certificate: none.${d.valuedAtCost.length ? ` Units ${d.valuedAtCost.join(', ')} declared at cost (no price on the order).` : ''}`,
      PAD,
      y,
      { width: INNER },
    )
    y = doc.y + 4

    // The sender's declaration, date and signature.
    doc.moveTo(0, y).lineTo(W, y).lineWidth(1).stroke()
    y += 4
    doc.font('body').fontSize(6.5).text(
      'I, the sender, declare that the particulars given on this declaration are correct and that this parcel holds no dangerous goods and nothing forbidden by law or by postal or customs rules.',
      PAD,
      y,
      { width: INNER },
    )
    y = Math.max(doc.y + 14, H - 30)
    doc.font('body').fontSize(7.5).text(`Date: ${input.date}`, PAD, y, { lineBreak: false })
    doc.text("Sender's signature:", PAD + 90, y, { lineBreak: false })
    doc.moveTo(PAD + 160, y + 8).lineTo(W - PAD, y + 8).lineWidth(0.6).stroke()
  }
  return pdfBuffer(doc)
}
