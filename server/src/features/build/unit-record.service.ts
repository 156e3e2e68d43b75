import type { UnitRecord } from '@kitwright/shared/build'
import type { Db } from '../../db/client'
import { NotFound } from '../../lib/http-errors'
import type { Storage } from '../../lib/storage'
import { loadBuildPage } from './build-page'
import { findBinByCode, findWorkOrderById, findWorkOrderBySerial, namesOf, orderNumberOf, piecesOfWorkOrder } from './build.queries'

/**
 * The build record of one serial (or of the unit in a scanned bin), whatever its status: the revision, where each pipe piece came
 * from (when it was cut through a Kitwright cut run), every tick and undo, photos, leak tests, rework.
 */
export async function getUnitRecord(db: Db, storage: Storage, serialOrBin: string): Promise<UnitRecord> {
  const code = serialOrBin.trim()
  // A scanned bin label works too, while the bin still travels with its unit.
  const bin = await findBinByCode(db, code)
  const wo = bin?.workOrderId ? await findWorkOrderById(db, bin.workOrderId) : await findWorkOrderBySerial(db, code)
  if (!wo) throw new NotFound(`No unit with serial "${code}"${bin ? ` (bin ${bin.code} holds no unit)` : ''}`)
  const [page, orderNumber, pieces] = await Promise.all([loadBuildPage(db, storage, wo), orderNumberOf(db, wo.orderId), piecesOfWorkOrder(db, wo.id)])
  const names = await namesOf(db, pieces.map((p) => p.cutBy))
  return {
    ...page,
    order: { number: orderNumber },
    cutThroughKitwright: pieces.length > 0,
    pieces: pieces.map((p) => ({
      label: p.label,
      length: p.length,
      cutRunNumber: p.cutRunNumber,
      stickPosition: p.stickPosition,
      stickLength: p.stickLength,
      fromOffcut: p.sourceOffcutId !== null,
      partSku: p.partSku,
      status: p.status,
      cutBy: p.cutBy ? { id: p.cutBy, name: names.get(p.cutBy) ?? 'Unknown user' } : null,
      cutAt: p.cutAt?.toISOString() ?? null,
    })),
  }
}
