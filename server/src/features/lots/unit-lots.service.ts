import { and, eq, isNull } from 'drizzle-orm'
import type { BuildPage } from '@kitwright/shared/build'
import type { FitLot } from '@kitwright/shared/lots'
import type { Db } from '../../db/client'
import { parts, unitLots } from '../../db/schema/index'
import type { SessionUser } from '../../lib/auth'
import { BadRequest, Conflict, Forbidden, NotFound } from '../../lib/http-errors'
import type { Storage } from '../../lib/storage'
import { loadBuildPage } from '../build/build-page'
import { findWorkOrderById, namesOf } from '../build/build.queries'
import { lockBuildable, settle } from '../build/build.service'
import { lockParts } from '../stock/stock.queries'
import { findLotByCode, lotBalances, lotNeedsOf } from './lots.queries'

async function reload(db: Db, storage: Storage, workOrderId: string): Promise<BuildPage> {
  const wo = await findWorkOrderById(db, workOrderId)
  if (!wo) throw new NotFound('No such work order')
  return loadBuildPage(db, storage, wo)
}

/** "A (5 free), B (2 free)": the lots the bench could take instead. */
function choicesText(choices: { code: string; free: number }[]): string {
  if (choices.length === 0) return 'no lot of it is in stock: receive one first, or ask the planner'
  return `lots in stock, oldest first: ${choices.map((c) => `${c.code} (${c.free} free)`).join(', ')}`
}

/**
 * Records which lot of a lot-tracked part went into the unit. The part must be a lot-tracked part
 * of the unit's bill of materials; the lot must have been received and have that many free (on
 * hand, less what is fitted into other units still in the shop). The part's row is locked, so two
 * benches fitting from the same lot queue and never fit more than it holds.
 */
export async function fitLot(db: Db, storage: Storage, workOrderId: string, input: FitLot, actor: SessionUser): Promise<{ page: BuildPage; summary: string }> {
  let summary = ''
  await db.transaction(async (tx) => {
    const wo = await lockBuildable(tx, workOrderId)
    const [part] = await lockParts(tx, [input.partId])
    if (!part) throw new BadRequest("No such part: choose the part from the unit's list of lot-tracked parts", { partId: 'No such part' })
    const needs = await lotNeedsOf(tx, wo)
    const need = needs.find((n) => n.partId === part.id)
    if (!need) {
      const why = part.lotTracked ? `is not in the bill of materials of unit ${wo.serial}` : 'is not tracked by lot'
      const list = needs.length ? `; this unit's lot-tracked parts: ${needs.map((n) => n.sku).join(', ')}` : '; this unit has no lot-tracked parts'
      throw new BadRequest(`${part.sku} ${part.name} ${why}${list}`, { partId: `${part.sku} ${why}` })
    }
    if (need.left === 0) {
      throw new Conflict(
        `All ${need.quantity} of ${part.sku} in unit ${wo.serial} already have their lot (${need.fitted.map((f) => f.lotCode).join(', ')}); undo one to change it`,
        { lotCode: 'Nothing left to record' },
      )
    }
    const quantity = input.quantity ?? need.left
    if (quantity > need.left) {
      throw new BadRequest(`Unit ${wo.serial} takes ${need.left} more of ${part.sku}, not ${quantity}`, { quantity: `At most ${need.left}` })
    }
    const balances = (await lotBalances(tx, [part.id])).filter((l) => l.free > 0)
    const lot = await findLotByCode(tx, part.id, input.lotCode)
    if (!lot) {
      throw new Conflict(
        `No lot "${input.lotCode}" of ${part.sku} has been received: scan the lot printed on the ${part.unitOfMeasure === 'each' ? 'bag or box' : part.unitOfMeasure} again, or pick one — ${choicesText(balances)}`,
        {
          lotCode: `Lot ${input.lotCode} of ${part.sku} is not in stock`,
        },
      )
    }
    const free = balances.find((l) => l.lotId === lot.id)?.free ?? 0
    if (free < quantity) {
      const others = balances.filter((l) => l.lotId !== lot.id)
      throw new Conflict(`Lot ${lot.code} of ${part.sku} has ${free} free, not ${quantity}: fit from another lot — ${choicesText(others)}`, {
        lotCode: `Only ${free} of lot ${lot.code} free`,
      })
    }
    await tx.insert(unitLots).values({ workOrderId: wo.id, partId: part.id, lotId: lot.id, quantity, fittedBy: actor.id })
    await settle(tx, wo)
    summary = `Fitted ${quantity} × ${part.sku} from lot ${lot.code} into ${wo.serial}`
  })
  return { page: await reload(db, storage, workOrderId), summary }
}

/** Undoes a lot fit (a wrong scan): only whoever recorded it, or a planner or admin. It stays on record as undone. */
export async function undoLotFit(
  db: Db,
  storage: Storage,
  workOrderId: string,
  fitId: string,
  actor: SessionUser,
): Promise<{ page: BuildPage; summary: string }> {
  let summary = ''
  await db.transaction(async (tx) => {
    const wo = await lockBuildable(tx, workOrderId)
    const [fit] = await tx
      .select()
      .from(unitLots)
      .where(and(eq(unitLots.id, fitId), eq(unitLots.workOrderId, wo.id)))
    if (!fit) throw new NotFound(`No such lot record on unit ${wo.serial}`)
    if (fit.undoneAt) throw new Conflict('This lot record is already undone')
    if (fit.fittedBy !== actor.id && actor.role !== 'planner' && actor.role !== 'admin') {
      const names = await namesOf(tx, [fit.fittedBy])
      throw new Forbidden(`Only ${names.get(fit.fittedBy) ?? 'the person who recorded it'} or a planner can undo this lot`)
    }
    await tx
      .update(unitLots)
      .set({ undoneAt: new Date(), undoneBy: actor.id })
      .where(and(eq(unitLots.id, fit.id), isNull(unitLots.undoneAt)))
    await settle(tx, wo)
    const [part] = await tx.select({ sku: parts.sku }).from(parts).where(eq(parts.id, fit.partId))
    summary = `Undid a lot of ${part?.sku ?? 'a part'} on ${wo.serial}`
  })
  return { page: await reload(db, storage, workOrderId), summary }
}
