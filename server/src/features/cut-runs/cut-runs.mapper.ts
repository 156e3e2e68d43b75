import { type CutRunDetail, type CutRunTotals, type CutStick } from '@kitwright/shared/cut-runs'
import type { CutRunRow } from '../../db/schema/index'
import type { selectRunContents } from './cut-runs.queries'

type Contents = Awaited<ReturnType<typeof selectRunContents>>

const iso = (d: Date | null) => (d ? d.toISOString() : null)

export function toTotals(run: CutRunRow): CutRunTotals {
  const waste = run.kerfLoss + run.trimLoss + run.scrapLength
  return {
    stockCost: run.stockCost,
    lowerBoundCost: run.lowerBoundCost,
    sticksUsed: run.sticksUsed,
    lowerBoundSticks: run.lowerBoundSticks,
    offcutsUsed: run.offcutsUsed,
    offcutsMade: run.offcutsMade,
    lengthUsed: run.lengthUsed,
    pieceLength: run.pieceLength,
    kerfLoss: run.kerfLoss,
    trimLoss: run.trimLoss,
    offcutLength: run.offcutLength,
    scrapLength: run.scrapLength,
    waste,
    wastePercent: run.lengthUsed > 0 ? (waste / run.lengthUsed) * 100 : 0,
    gap: run.stockCost > 0 ? Math.max(0, (run.stockCost - run.lowerBoundCost) / run.stockCost) : 0,
  }
}

export function toCutRunDetail(run: CutRunRow, contents: Contents, names: Map<string, string>): CutRunDetail {
  const cutsByStick = new Map<string, Contents['cuts']>()
  for (const c of contents.cuts) {
    const list = cutsByStick.get(c.cut.stickId) ?? []
    list.push(c)
    cutsByStick.set(c.cut.stickId, list)
  }
  const sticks: CutStick[] = contents.sticks.map(({ stick, partSku, sourceOffcutCode, offcutCode }) => ({
    id: stick.id,
    position: stick.position,
    patternIndex: stick.patternIndex,
    partId: stick.partId,
    partSku,
    source: stick.sourceOffcutId ? 'offcut' : 'stock',
    stickLength: stick.stickLength,
    sourceOffcutCode: stick.sourceOffcutId ? sourceOffcutCode : null,
    length: stick.length,
    trim: stick.trim,
    status: stick.status,
    remnant: stick.remnant,
    remnantIsOffcut: stick.remnantIsOffcut,
    offcutId: stick.offcutId,
    offcutCode: stick.offcutId ? offcutCode : null,
    damagedReason: stick.damagedReason,
    replanned: stick.replanOfStickId !== null,
    cuts: (cutsByStick.get(stick.id) ?? []).map(({ cut, serial, label, cutByName }) => ({
      id: cut.id,
      position: cut.position,
      offset: cut.offset,
      length: cut.length,
      label,
      workOrderId: cut.workOrderId,
      serial,
      cutPartId: cut.cutPartId,
      status: cut.status,
      cutAt: iso(cut.cutAt),
      cutBy: cutByName,
    })),
  }))
  const binOf = new Map(contents.bins.map((b) => [b.workOrderId, b]))
  const workOrders = contents.workOrders
    .map((w) => {
      const own = contents.cuts.filter((c) => c.cut.workOrderId === w.id && c.cut.status !== 'replanned')
      const bin = binOf.get(w.id)
      return {
        id: w.id,
        serial: w.serial,
        kitSku: w.kitSku,
        revisionCode: w.revisionCode,
        status: w.status,
        pieces: own.length,
        cut: own.filter((c) => c.cut.status === 'cut').length,
        bin: bin ? { id: bin.id, code: bin.code } : null,
      }
    })
    .sort((a, b) => a.serial.localeCompare(b.serial, 'en', { numeric: true }))
  return {
    id: run.id,
    number: run.number,
    status: run.status,
    planStatus: run.planStatus,
    kerf: run.kerf,
    endTrim: run.endTrim,
    minOffcut: run.minOffcut,
    solveMs: run.solveMs,
    solverNote: run.solverNote,
    totals: toTotals(run),
    createdAt: run.createdAt.toISOString(),
    createdBy: run.createdBy ? (names.get(run.createdBy) ?? null) : null,
    publishedAt: iso(run.publishedAt),
    publishedBy: run.publishedBy ? (names.get(run.publishedBy) ?? null) : null,
    workOrders,
    sticks,
  }
}
