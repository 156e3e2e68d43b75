import { createRequire } from 'node:module'
import PDFDocument from 'pdfkit'

const require = createRequire(import.meta.url)
// The .woff files (not .woff2): pdfkit reads them reliably. They cover Western European letters.
const REGULAR = require.resolve('@fontsource/roboto-condensed/files/roboto-condensed-latin-400-normal.woff')
const BOLD = require.resolve('@fontsource/roboto-condensed/files/roboto-condensed-latin-700-normal.woff')

/** A PDF page size in points (1 pt = 1/72 in). */
export type PageSize = [number, number]

/** Letter and A4 in points. */
export const PAPER: Record<'letter' | 'a4', PageSize> = { letter: [612, 792], a4: [595.28, 841.89] }

/** A new PDF in the shop's type (Roboto Condensed as `body` and `bold`), without an automatic first page. */
export function createPdf(title: string): PDFKit.PDFDocument {
  const doc = new PDFDocument({ autoFirstPage: false, info: { Title: title, Creator: 'Kitwright' } })
  doc.registerFont('body', REGULAR)
  doc.registerFont('bold', BOLD)
  doc.font('body')
  return doc
}

/** Ends the document and collects its bytes. */
export function pdfBuffer(doc: PDFKit.PDFDocument): Promise<Buffer> {
  return new Promise((resolve, reject) => {
    const chunks: Buffer[] = []
    doc.on('data', (c: Buffer) => chunks.push(c))
    doc.on('end', () => resolve(Buffer.concat(chunks)))
    doc.on('error', reject)
    doc.end()
  })
}
