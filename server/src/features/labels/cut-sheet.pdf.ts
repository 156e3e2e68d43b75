import type { CutRunDetail, CutStick } from '@kitwright/shared/cut-runs'
import { formatLength, type LengthUnit } from '@kitwright/shared/domain/units'
import { createPdf, pdfBuffer, PAPER } from './pdf-document'

/** The cautions printed on every cut sheet; the saw maker's instructions and local practice come first. */
export const CUT_SHEET_CAUTIONS = [
  'Wear eye protection; PVC chips fly.',
  'Clamp the work; never hold a short piece by hand near the blade.',
  'Keep hands clear of the blade; let it stop before reaching in.',
  "Follow the saw maker's instructions and your shop's local safety practice; they come first.",
]

/** Consecutive equal items merged into runs: [item, count]. */
function runsOf<T>(items: readonly T[], same: (a: T, b: T) => boolean): [T, number][] {
  const runs: [T, number][] = []
  for (const item of items) {
    const last = runs.at(-1)
    if (last && same(last[0], item)) last[1] += 1
    else runs.push([item, 1])
  }
  return runs
}

interface Pattern {
  index: number
  sticks: CutStick[]
}

/** Sticks grouped by pattern, in saw order; damaged sticks stay listed (marked) so the sheet matches the bench. */
export function patternsOf(run: CutRunDetail): Pattern[] {
  const byIndex = new Map<number, CutStick[]>()
  for (const s of run.sticks) byIndex.set(s.patternIndex, [...(byIndex.get(s.patternIndex) ?? []), s])
  return [...byIndex.entries()].map(([index, sticks]) => ({ index, sticks }))
}

function drawStick(doc: PDFKit.PDFDocument, stick: CutStick, x: number, y: number, width: number, unit: LengthUnit, kerf: number) {
  const h = 26
  const scale = width / stick.length
  doc.save().lineWidth(0.75).strokeColor('#222222').rect(x, y, width, h).stroke()
  if (stick.trim > 0) doc.rect(x, y, Math.max(1, stick.trim * scale), h).fill('#999999')
  for (const cut of stick.cuts) {
    const cx = x + (stick.trim + cut.offset) * scale
    const cw = cut.length * scale
    doc.rect(cx, y, cw, h).fillAndStroke('#dbeafe', '#1e3a8a')
    if (kerf > 0) doc.rect(cx + cw, y, Math.max(0.75, kerf * scale), h).fill('#b91c1c')
    if (cw > 34) {
      doc.fillColor('#111111').font('bold').fontSize(8).text(formatLength(cut.length, unit), cx + 1, y + 4, { width: cw - 2, align: 'center', lineBreak: false })
      doc.font('body').fontSize(7).text(cut.serial, cx + 1, y + 15, { width: cw - 2, align: 'center', lineBreak: false })
    }
  }
  const rw = stick.remnant * scale
  if (stick.remnant > 0) {
    const rx = x + width - rw
    doc.rect(rx, y, rw, h).fill(stick.remnantIsOffcut ? '#dcfce7' : '#fee2e2')
    if (rw > 40) {
      doc.fillColor('#111111').font('body').fontSize(7).text(`${stick.remnantIsOffcut ? 'offcut' : 'waste'} ${formatLength(stick.remnant, unit)}`, rx + 1, y + 9, { width: rw - 2, align: 'center', lineBreak: false })
    }
  }
  doc.restore()
  return y + h
}

/**
 * The printed cut sheet of a published run: per pattern the stick drawn to scale, how many times to
 * cut it, the cut order, and per stick which work order (and bin, once scanned) each piece goes to.
 */
export async function cutSheetPdf(run: CutRunDetail, opts: { paper: 'letter' | 'a4'; unit: LengthUnit; shopName: string }): Promise<Buffer> {
  const { unit } = opts
  const len = (v: number) => formatLength(v, unit)
  const doc = createPdf(`Cut sheet ${run.number}`)
  const [pw, ph] = PAPER[opts.paper]
  const margin = 40
  const width = pw - 2 * margin
  const newPage = () => doc.addPage({ size: PAPER[opts.paper], margin })
  const room = (needed: number) => {
    if (doc.y + needed > ph - margin) newPage()
  }
  newPage()
  doc.font('bold').fontSize(20).text(`Cut sheet ${run.number}`, margin, margin)
  doc.font('body').fontSize(10).fillColor('#333333')
  doc.text(`${opts.shopName} · ${run.status} · planned ${run.createdAt.slice(0, 10)}${run.publishedBy ? ` · published by ${run.publishedBy}` : ''}`)
  doc.text(`Kerf ${len(run.kerf)} · end trim ${len(run.endTrim)} · keep offcuts of ${len(run.minOffcut)} or more`)
  const t = run.totals
  doc.text(`${t.sticksUsed} sticks (${t.offcutsUsed} from offcuts) · pieces ${len(t.pieceLength)} · waste ${len(t.waste)} (${t.wastePercent.toFixed(1)} %) · ${t.offcutsMade} offcut${t.offcutsMade === 1 ? '' : 's'} to stock`)
  doc.moveDown(0.5)
  const binOf = new Map(run.workOrders.map((w) => [w.id, w.bin?.code ?? null]))

  // Cautions, boxed, before any pattern.
  const boxTop = doc.y
  doc.font('bold').fontSize(11).fillColor('#7c2d12').text('Cutting safely', margin + 8, boxTop + 6)
  doc.font('body').fontSize(9.5).fillColor('#111111')
  for (const c of CUT_SHEET_CAUTIONS) doc.text(`•  ${c}`, margin + 8, doc.y, { width: width - 16 })
  const boxBottom = doc.y + 6
  doc.save().lineWidth(1.5).strokeColor('#d97706').rect(margin, boxTop, width, boxBottom - boxTop).stroke().restore()
  doc.y = boxBottom + 12

  for (const pattern of patternsOf(run)) {
    const first = pattern.sticks[0]!
    const live = pattern.sticks.filter((s) => s.status !== 'damaged')
    room(110)
    const source = first.source === 'offcut' ? `offcut ${first.sourceOffcutCode} (${len(first.length)})` : `${len(first.length)} stick`
    doc.fillColor('#111111').font('bold').fontSize(13).text(`Pattern ${pattern.index + 1}: ${first.partSku}, ${source}`, margin, doc.y)
    doc.font('bold').fontSize(11).text(`Cut ${pattern.sticks.length} ${pattern.sticks.length === 1 ? 'time' : 'times'}${live.length < pattern.sticks.length ? ` (${pattern.sticks.length - live.length} damaged)` : ''}`)
    let n = 0
    const order = runsOf(first.cuts, (a, b) => a.length === b.length && a.label === b.label).map(([c, count]) => {
      const from = n + 1
      n += count
      return `${count > 1 ? `${from}-${n}` : from}. ${len(c.length)} ${c.label}${count > 1 ? ` (${count}×)` : ''}`
    })
    doc.font('body').fontSize(10).text(`Cut order: ${order.join('   ')}`, { width })
    const remnantNote = first.remnant > 0 ? `${first.remnantIsOffcut ? 'Offcut to stock' : 'Waste'}: ${len(first.remnant)}` : 'No remnant'
    doc.text(`${first.trim > 0 ? `Square the end first (trim ${len(first.trim)}). ` : ''}${remnantNote}.`, { width })
    doc.y = drawStick(doc, first, margin, doc.y + 4, width, unit, run.kerf) + 8
    for (const stick of pattern.sticks) {
      room(30)
      const y = doc.y
      doc.save().lineWidth(0.75).rect(margin, y + 1, 9, 9).stroke().restore()
      const pieces = runsOf(stick.cuts, (a, b) => a.length === b.length && a.workOrderId === b.workOrderId)
        .map(([c, count]) => `${count > 1 ? `${count} × ` : ''}${len(c.length)} for WO ${c.serial}${binOf.get(c.workOrderId) ? ` (${binOf.get(c.workOrderId)})` : ''}`)
        .join('   |   ')
      const state = stick.status === 'damaged' ? ` [damaged: ${stick.damagedReason ?? ''}]` : ''
      doc.font('bold').fontSize(9.5).text(`Stick ${stick.position}${state}: `, margin + 14, y, { continued: true })
      doc.font('body').text(pieces, { width: width - 14 })
      doc.moveDown(0.2)
    }
    doc.moveDown(0.8)
  }
  room(40)
  doc.font('body').fontSize(9).fillColor('#333333').text('Tick each stick as it is cut. Put every piece in its work order’s bin; the bench shows which bin once it is scanned.', margin, doc.y, { width })
  return pdfBuffer(doc)
}
