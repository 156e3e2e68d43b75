import type { CutRunDetail, CutStick } from '@kitwright/shared/cut-runs'
import { foldRuns, runNumbers, samePieceRow, stopSettings } from '@kitwright/shared/domain/saw-order'
import { formatLength, type LengthUnit } from '@kitwright/shared/domain/units'
import { placeUnderLabels } from '@kitwright/shared/stick-labels'
import { STICK_LEGEND, STICK_PALETTE as P } from '@kitwright/shared/stick-palette'
import { createPdf, pdfBuffer, PAPER } from './pdf-document'
import { CUT_RUN_STATUS_LABELS } from '@kitwright/shared/status-words'

/** The cautions printed on every cut sheet; the saw maker's instructions and local practice come first. */
export const CUT_SHEET_CAUTIONS = [
  'Wear eye protection; PVC chips fly.',
  'Clamp the work; never hold a short piece by hand near the blade.',
  'Keep hands clear of the blade; let it stop before reaching in.',
  "Follow the saw maker's instructions and your shop's local safety practice; they come first.",
]

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

// Layout, in points. Every height is fixed so a pattern is measured before it is placed.
const MARGIN = 40
const FOOTER = 16
const HEAD_H = 18 // pattern heading
const INFO_H = 13 // one line under it
const BAR_H = 30 // the stick
const LEVEL_H = 10 // one row of numbers under the stick, for pieces too narrow to hold theirs
const TABLE_HEAD_H = 16
const STICK_ROW_H = 16
const ROW_H = 15
const AFTER_PATTERN = 14
const NUMBER_SIZE = 7.5

type Doc = PDFKit.PDFDocument

/** Text cut to fit `width` at the current font, with an ellipsis when cut. */
function fit(doc: Doc, text: string, width: number): string {
  if (doc.widthOfString(text) <= width) return text
  let t = text
  while (t.length > 1 && doc.widthOfString(`${t}…`) > width) t = t.slice(0, -1)
  return `${t}…`
}

/** One line of text at (x, y), never wrapping and never starting a page by itself. */
function line(doc: Doc, text: string, x: number, y: number, width: number, opts: { font?: 'body' | 'bold'; size?: number; color?: string; align?: 'left' | 'center' | 'right' } = {}) {
  doc.font(opts.font ?? 'body').fontSize(opts.size ?? 9.5).fillColor(opts.color ?? P.ink)
  doc.text(fit(doc, text, width), x, y, { width, align: opts.align ?? 'left', lineBreak: false })
}

interface PieceMark {
  x: number
  w: number
  number: string
  length: string
  /** Row under the stick for a number that does not fit inside its piece; null: inside. */
  level: number | null
}

/** Where every piece's number goes: inside the piece when it fits, else in a row under the stick (shared/stick-labels.ts). */
function layoutMarks(doc: Doc, stick: CutStick, x0: number, width: number, unit: LengthUnit): { marks: PieceMark[]; levels: number } {
  const scale = width / stick.length
  doc.font('bold').fontSize(NUMBER_SIZE)
  const marks = stick.cuts.map((c, i): PieceMark => {
    const w = c.length * scale
    const number = String(i + 1)
    return { x: x0 + c.offset * scale, w, number, length: formatLength(c.length, unit), level: doc.widthOfString(number) + 3 <= w ? null : -1 }
  })
  const under = marks.filter((m) => m.level !== null)
  const levels = placeUnderLabels(
    under.map((m) => ({ cx: m.x + m.w / 2, half: doc.widthOfString(m.number) / 2 + 1.5 })),
    { leaderHalf: 0.6, maxLevels: 4, min: x0, max: x0 + width },
  )
  under.forEach((m, i) => (m.level = levels[i]!))
  return { marks, levels: under.length > 0 ? Math.max(...levels) + 1 : 0 }
}

/** Height of the drawing of `stick` (the bar and its rows of numbers). */
function drawingHeight(doc: Doc, stick: CutStick, width: number, unit: LengthUnit) {
  const { levels } = layoutMarks(doc, stick, MARGIN, width, unit)
  return BAR_H + (levels > 0 ? 3 + levels * LEVEL_H : 0) + 6
}

/** The stick to scale in Kitwright's palette, every piece numbered as its row in the cut list. */
function drawStick(doc: Doc, stick: CutStick, x0: number, y: number, width: number, unit: LengthUnit, kerf: number) {
  const scale = width / stick.length
  const { marks } = layoutMarks(doc, stick, x0, width, unit)
  doc.save()
  doc.lineWidth(0.8).rect(x0, y, width, BAR_H).fillAndStroke(P.scrap, P.edge)
  if (stick.trim > 0) doc.rect(x0, y, Math.max(1.2, stick.trim * scale), BAR_H).fill(P.trim)
  for (const m of marks) {
    doc.lineWidth(0.9).rect(m.x, y, m.w, BAR_H).fillAndStroke(P.piece, P.pieceEdge)
    if (kerf > 0) doc.rect(m.x + m.w, y, Math.max(0.9, kerf * scale), BAR_H).fill(P.kerf)
  }
  const rx = x0 + (stick.length - stick.remnant) * scale
  const rw = stick.remnant * scale
  if (stick.remnant > 0 && rw > 1) {
    doc.lineWidth(1).rect(rx + 1, y + 1, rw - 2, BAR_H - 2)
    if (stick.remnantIsOffcut) doc.dash(3, { space: 2 }).fillAndStroke(P.offcut, P.offcutEdge)
    else doc.dash(1, { space: 1.5 }).fillAndStroke(P.scrap, P.scrapEdge)
    doc.undash()
    const word = `${stick.remnantIsOffcut ? 'offcut' : 'scrap'} ${formatLength(stick.remnant, unit)}`
    doc.font('body').fontSize(7)
    if (doc.widthOfString(word) + 4 <= rw) line(doc, word, rx, y + BAR_H / 2 - 4, rw, { size: 7, align: 'center' })
  }
  for (const m of marks) {
    if (m.level === null) {
      line(doc, m.number, m.x, y + 4, m.w, { font: 'bold', size: NUMBER_SIZE, color: P.pieceInk, align: 'center' })
      doc.font('body').fontSize(6.5)
      if (doc.widthOfString(m.length) + 3 <= m.w) line(doc, m.length, m.x, y + 17, m.w, { size: 6.5, color: P.pieceInk, align: 'center' })
      continue
    }
    const cx = m.x + m.w / 2
    doc.lineWidth(0.5).strokeColor(P.pieceEdge).moveTo(cx, y + BAR_H).lineTo(cx, y + BAR_H + 4 + m.level * LEVEL_H).stroke()
  }
  // The numbers under the stick after every leader, each on a paper-white patch, so no leader runs over one.
  for (const m of marks) {
    if (m.level === null) continue
    const cx = m.x + m.w / 2
    const top = y + BAR_H + 3 + m.level * LEVEL_H
    doc.font('bold').fontSize(NUMBER_SIZE)
    const tw = doc.widthOfString(m.number)
    doc.rect(cx - tw / 2 - 1, top + 1, tw + 2, LEVEL_H - 1).fill(P.scrap)
    line(doc, m.number, cx - 10, top + 1, 20, { font: 'bold', size: NUMBER_SIZE, color: P.pieceInk, align: 'center' })
  }
  doc.restore()
}

/** The legend in words, with the same swatches as the drawing. */
function drawLegend(doc: Doc, x0: number, y: number, width: number): number {
  let x = x0
  let row = y
  for (const item of STICK_LEGEND.filter((l) => !l.benchOnly)) {
    doc.font('body').fontSize(8.5)
    const w = 22 + doc.widthOfString(item.words) + 14
    if (x + w > x0 + width) {
      x = x0
      row += 14
    }
    doc.save().lineWidth(0.9)
    if (item.key === 'piece') {
      doc.rect(x, row, 16, 10).fillAndStroke(P.piece, P.pieceEdge)
      line(doc, '7', x, row + 1.5, 16, { font: 'bold', size: 7, color: P.pieceInk, align: 'center' })
    } else if (item.key === 'kerf') doc.rect(x + 6, row, 3, 10).fill(P.kerf)
    else if (item.key === 'trim') doc.rect(x + 4, row, 6, 10).fill(P.trim)
    else if (item.key === 'offcut') doc.dash(3, { space: 2 }).rect(x, row, 16, 10).fillAndStroke(P.offcut, P.offcutEdge).undash()
    else doc.dash(1, { space: 1.5 }).rect(x, row, 16, 10).fillAndStroke(P.scrap, P.scrapEdge).undash()
    doc.restore()
    line(doc, item.words, x + 22, row + 1, w - 22, { size: 8.5 })
    x += w
  }
  return row + 14
}

// Table columns: order, length, quantity, part, unit/bin, tick box.
function columns(width: number) {
  const order = 46
  const length = 70
  const qty = 34
  const tick = 30
  const unit = Math.min(170, width * 0.32)
  const part = width - order - length - qty - unit - tick
  const xs = [0, order, order + length, order + length + qty, order + length + qty + part, width - tick]
  return { xs, ws: [order - 6, length - 6, qty - 6, part - 6, unit - 6, tick] }
}

/**
 * The printed cut sheet of a published run. Per pattern: the stick drawn to scale with every piece
 * numbered, then a cut list per stick (order, length, quantity, part, unit and bin, tick box) in saw
 * order — longest first, equal lengths together — so the stop block is set once per length. A
 * pattern is measured first and never split across pages; one taller than a page starts on its own
 * page and goes on with its drawing repeated under "continued".
 */
export async function cutSheetPdf(run: CutRunDetail, opts: { paper: 'letter' | 'a4'; unit: LengthUnit; shopName: string }): Promise<Buffer> {
  const { unit } = opts
  const len = (v: number) => formatLength(v, unit)
  const doc = createPdf(`Cut sheet ${run.number}`)
  const [pw, ph] = PAPER[opts.paper]
  const width = pw - 2 * MARGIN
  const bottom = ph - MARGIN - FOOTER
  const binOf = new Map(run.workOrders.map((w) => [w.id, w.bin?.code ?? null]))
  let page = 0
  let y = MARGIN
  const newPage = () => {
    // The document's own margins sit outside ours, so pdfkit never starts a page by itself.
    doc.addPage({ size: PAPER[opts.paper], margins: { top: 20, bottom: 10, left: 20, right: 20 } })
    page += 1
    line(doc, `Cut sheet ${run.number} · page ${page}`, MARGIN, ph - MARGIN, width, { size: 8, color: '#57534e', align: 'right' })
    y = MARGIN
  }

  newPage()
  line(doc, `Cut sheet ${run.number}`, MARGIN, y, width, { font: 'bold', size: 20 })
  y += 26
  const t = run.totals
  for (const text of [
    `${opts.shopName} · ${CUT_RUN_STATUS_LABELS[run.status]} · planned ${run.createdAt.slice(0, 10)}${run.publishedBy ? ` · published by ${run.publishedBy}` : ''}`,
    `Kerf ${len(run.kerf)} · end trim ${len(run.endTrim)} · keep offcuts of ${len(run.minOffcut)} or more`,
    `${t.sticksUsed} stick${t.sticksUsed === 1 ? '' : 's'} (${t.offcutsUsed} from offcuts) · pieces ${len(t.pieceLength)} · ` +
      `waste ${len(t.waste)} (${t.wastePercent.toFixed(1)} %) · ${t.offcutsMade} offcut${t.offcutsMade === 1 ? '' : 's'} to stock`,
  ]) {
    line(doc, text, MARGIN, y, width, { size: 10, color: '#44403c' })
    y += 13
  }
  y += 6

  // Cautions, boxed, before any pattern.
  const boxTop = y
  doc.font('bold').fontSize(11).fillColor('#7c2d12').text('Cutting safely', MARGIN + 8, boxTop + 6, { width: width - 16 })
  doc.font('body').fontSize(9.5).fillColor(P.ink)
  for (const c of CUT_SHEET_CAUTIONS) doc.text(`•  ${c}`, MARGIN + 8, doc.y, { width: width - 16 })
  const boxBottom = doc.y + 6
  doc.save().lineWidth(1.5).strokeColor('#d97706').rect(MARGIN, boxTop, width, boxBottom - boxTop).stroke().restore()
  y = boxBottom + 10

  doc.font('body').fontSize(9.5).fillColor(P.ink)
  const howTo =
    'Cut each stick in the order of its list: longest first, equal lengths one after another, so the stop block is set once per length and the stick left on the saw stays long enough to clamp. ' +
      'Each number on a drawing is the piece’s row in the list. Tick each row as its pieces come off the saw and put them in the bin shown.'
  doc.text(howTo, MARGIN, y, { width })
  y = doc.y + 6
  y = drawLegend(doc, MARGIN, y, width) + 10

  const { xs, ws } = columns(width)
  const tableHead = () => {
    doc.save().rect(MARGIN, y, width, TABLE_HEAD_H - 2).fill('#e7e5e4').restore()
    ;['Order', 'Length', 'Qty', 'Part', 'Unit / bin', 'Done'].forEach((h, i) => line(doc, h, MARGIN + xs[i]! + 3, y + 3, ws[i]!, { font: 'bold', size: 9 }))
    y += TABLE_HEAD_H
  }
  const tickBox = (yy: number) => doc.save().lineWidth(0.9).strokeColor(P.edge).rect(MARGIN + xs[5]! + 8, yy + 2, 10, 10).stroke().restore()

  for (const pattern of patternsOf(run)) {
    const first = pattern.sticks[0]!
    const live = pattern.sticks.filter((s) => s.status !== 'damaged')
    const source = first.source === 'offcut' ? `offcut ${first.sourceOffcutCode} (${len(first.length)})` : `${len(first.length)} stick`
    const lengths = first.cuts.map((c) => c.length)
    const settings = [...new Set(lengths)].map(len)
    const damaged = live.length < pattern.sticks.length ? ` (${pattern.sticks.length - live.length} damaged)` : ''
    const heading = `Pattern ${pattern.index + 1}: ${first.partSku}, ${source} · cut ${pattern.sticks.length} ${pattern.sticks.length === 1 ? 'stick' : 'sticks'}${damaged}`
    const remnantNote = first.remnant > 0 ? (first.remnantIsOffcut ? `offcut ${len(first.remnant)} to the rack` : `scrap ${len(first.remnant)}`) : 'no remnant'
    const squareFirst = first.trim > 0 ? `Square the end first (trim ${len(first.trim)}). ` : ''
    const stops = stopSettings(lengths)
    const info = `${squareFirst}${first.cuts.length} pieces; stop block at ${settings.join(', ')} (${stops} setting${stops === 1 ? '' : 's'}); ${remnantNote}.`
    const drawH = drawingHeight(doc, first, width, unit)
    const headH = HEAD_H + INFO_H + drawH + TABLE_HEAD_H
    const groups = pattern.sticks.map((stick) => ({ stick, rows: foldRuns(stick.cuts, samePieceRow) }))
    const groupH = (g: (typeof groups)[number]) => STICK_ROW_H + g.rows.length * ROW_H
    const blockH = headH + groups.reduce((s, g) => s + groupH(g), 0)

    const head = (continued: boolean) => {
      line(doc, `${heading}${continued ? ' (continued)' : ''}`, MARGIN, y, width, { font: 'bold', size: 12.5 })
      y += HEAD_H
      line(doc, info, MARGIN, y, width, { size: 9.5, color: '#44403c' })
      y += INFO_H
      drawStick(doc, first, MARGIN, y, width, unit, run.kerf)
      y += drawH
      tableHead()
    }
    const fresh = () => {
      newPage()
      head(true)
    }
    // A pattern that fits on what is left of this page goes here; one that fits on a page starts
    // a new one; a taller one starts at the top of a page and goes on, continued, on the next.
    if (y + blockH > bottom && y > MARGIN) newPage()
    head(false)
    for (const g of groups) {
      // A stick's list stays together when it can; only one longer than a page breaks between rows.
      const fitsFreshPage = MARGIN + headH + groupH(g) <= bottom
      if (y + groupH(g) > bottom && (fitsFreshPage || y + STICK_ROW_H + ROW_H > bottom)) fresh()
      const stickRow = (continued: boolean) => {
        doc.save().rect(MARGIN, y, width, STICK_ROW_H - 2).fill('#f5f5f4').restore()
        const state = g.stick.status === 'damaged' ? ` · damaged: ${g.stick.damagedReason ?? ''}` : g.stick.replanned ? ' · re-planned' : ''
        line(doc, `Stick ${g.stick.position}${continued ? ' (continued)' : ''}${state}`, MARGIN + 3, y + 2.5, width - 40, { font: 'bold', size: 9.5 })
        y += STICK_ROW_H
      }
      stickRow(false)
      for (const r of g.rows) {
        if (y + ROW_H > bottom) {
          fresh()
          stickRow(true)
        }
        const c = r.items[0]!
        const bin = binOf.get(c.workOrderId)
        const cells = [runNumbers(r), len(c.length), String(r.items.length), c.label, `WO ${c.serial} · ${bin ? `bin ${bin}` : 'bin at the bench'}`]
        cells.forEach((text, i) => line(doc, text, MARGIN + xs[i]! + 3, y + 2.5, ws[i]!, { font: i < 3 ? 'bold' : 'body', size: 9.5 }))
        tickBox(y)
        doc.save().lineWidth(0.4).strokeColor('#d6d3d1').moveTo(MARGIN, y + ROW_H - 0.5).lineTo(MARGIN + width, y + ROW_H - 0.5).stroke().restore()
        y += ROW_H
      }
    }
    y += AFTER_PATTERN
  }
  if (y + 30 > bottom) newPage()
  doc.font('body').fontSize(9).fillColor('#44403c').text(
    'Put every piece in its work order’s bin; the bench shows which bin once it is scanned. Offcuts get their label at the bench.',
    MARGIN,
    y,
    { width },
  )
  return pdfBuffer(doc)
}
