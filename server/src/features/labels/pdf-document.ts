import { createRequire } from 'node:module'
import type { Response } from 'express'
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

/**
 * Sends a PDF for the browser to show in its own viewer (Content-Disposition inline, with the name
 * used when it is saved). The app's CSP has `object-src 'none'`, which stops Chrome's viewer (it
 * shows the file through an internal <embed>, crbug.com/271452): a PDF answer carries only
 * `frame-ancestors 'self'` instead; helmet's nosniff and the explicit type still stand.
 */
export function sendPdfInline(res: Response, filename: string, pdf: Buffer) {
  res.type('application/pdf').set('content-disposition', `inline; filename="${filename.replace(/[^\w.-]/g, '-')}"`).set('content-security-policy', "frame-ancestors 'self'").send(pdf)
}
