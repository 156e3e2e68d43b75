import type { PipeStock } from '@kitwright/shared/cut-runs'
import type { Db, Tx } from '../../db/client'
import { selectBuckets } from '../stock/stock.queries'
import { selectOffcutsInStock, selectPipeParts } from './cut-runs.queries'

/**
 * Pipe on hand from the ledger, per part and stick length (available = on hand − reserved), with the
 * offcuts on the rack: what a cut run may be planned from.
 */
export async function loadPipeStock(db: Db | Tx, partIds?: readonly string[]): Promise<PipeStock[]> {
  const pipeParts = await selectPipeParts(db, partIds)
  const ids = pipeParts.map((p) => p.id)
  const buckets = await selectBuckets(db, ids)
  const offcutRows = await selectOffcutsInStock(db, ids)
  return pipeParts.map((part) => {
    const lengths = new Set(part.stickLengths)
    for (const b of buckets) if (b.partId === part.id && b.stickLength !== null && b.onHand > 0) lengths.add(b.stickLength)
    const sticks = [...lengths]
      .sort((a, b) => a - b)
      .map((stickLength) => {
        const b = buckets.find((x) => x.partId === part.id && x.stickLength === stickLength)
        const onHand = b ? Number(b.onHand) : 0
        const reserved = b ? Number(b.reserved) : 0
        return { stickLength, onHand, available: Math.max(0, onHand - reserved) }
      })
    const offcuts = offcutRows.filter((o) => o.partId === part.id).map((o) => ({ id: o.id, code: o.code, length: o.length }))
    return { partId: part.id, sku: part.sku, name: part.name, sticks, offcuts }
  })
}
