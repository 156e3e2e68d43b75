import { compareReleasePriority, planRelease, type ReleaseCandidate } from '@kitwright/shared/domain/release-plan'
import type { ReleaseOrders, ReleasePreview, ReleaseResult, ReleasedOrder, ReleaseShortage } from '@kitwright/shared/work-orders'
import { shortageFieldKey } from '@kitwright/shared/work-orders'
import type { Db, Tx } from '../../db/client'
import { Conflict, HttpError, NotFound } from '../../lib/http-errors'
import { onHoldConflict } from '../orders/order-lifecycle.service'
import { addOrderEvent } from '../orders/orders.service'
import { reserveStock, type Actor } from '../stock/stock.service'
import { lockParts, selectBuckets } from '../stock/stock.queries'
import {
  insertWorkOrders,
  lockOrder,
  mapLineToKit,
  markReleased,
  nextSerials,
  selectBomLines,
  selectKitsByStoreProduct,
  selectLines,
  selectNewestReleasedRevisions,
  selectOrderForRelease,
  selectOrderNumbersById,
  selectReleaseSortKeys,
  selectRevisionsWithCutParts,
} from './release.queries'

/** A unit's serial number as printed on its bin label and build record: `U-1001`. */
export function formatSerial(n: number): string {
  return `U-${n}`
}

/** Free stock per part (on hand − all reservations); `lock` first when the caller is about to reserve. */
async function freeStock(tx: Tx, partIds: readonly string[], { lock }: { lock: boolean }): Promise<Map<string, number>> {
  if (lock) await lockParts(tx, partIds)
  const available = new Map<string, number>()
  for (const b of await selectBuckets(tx, partIds)) available.set(b.partId, (available.get(b.partId) ?? 0) + b.onHand - b.reserved)
  return available
}

type OrderRow = NonNullable<Awaited<ReturnType<typeof lockOrder>>>
type LineRow = Awaited<ReturnType<typeof selectLines>>[number]

/** Why this order cannot be released at all, whatever the stock (null when it can). */
function releaseBlocker(order: OrderRow): HttpError | null {
  if (order.status === 'cancelled') return new Conflict(`Order ${order.number} is cancelled; a cancelled order cannot be released`)
  if (order.status !== 'open') return new Conflict(`Order ${order.number} is already released; its work orders are on the order page`)
  if (order.heldAt) return onHoldConflict(order, 'released')
  if (order.source === 'store' && order.paymentStatus !== 'paid') {
    return new Conflict(`Order ${order.number} is not paid yet (payment ${order.paymentStatus}); release it when the store reports it paid`)
  }
  return null
}

function unmappedLine(order: OrderRow, line: LineRow): Conflict {
  return new Conflict(
    `Order ${order.number}, line ${line.lineNo}: ${line.sku} (${line.description}) maps to no kit; set it as the store product of a kit, then release`,
    {
      [`lines.${line.lineNo - 1}.kitId`]: 'Maps to no kit',
    },
  )
}

function noReleasedRevision(order: OrderRow, line: LineRow): Conflict {
  return new Conflict(`Order ${order.number}: kit ${line.sku} has no released revision; release one on the kits page, then release the order`, {
    [`lines.${line.lineNo - 1}.kitId`]: 'No released revision',
  })
}

type Revision = Awaited<ReturnType<typeof selectNewestReleasedRevisions>>[number]
type BomRow = Awaited<ReturnType<typeof selectBomLines>>[number]

/** What the whole order needs per part: each line's kit revision BOM × the line's units. */
function orderNeeds(lines: readonly { kitId: string | null; quantity: number }[], revisions: ReadonlyMap<string, Revision>, bom: readonly BomRow[]) {
  const needed = new Map<string, { sku: string; name: string; quantity: number }>()
  for (const line of lines) {
    const rev = revisions.get(line.kitId!)!
    for (const b of bom.filter((x) => x.revisionId === rev.id)) {
      const n = needed.get(b.partId) ?? { sku: b.sku, name: b.name, quantity: 0 }
      needed.set(b.partId, { ...n, quantity: n.quantity + b.quantity * line.quantity })
    }
  }
  return needed
}

/**
 * Releases one order inside the caller's transaction: one work order per unit of each kit line, at
 * the kit's newest released revision (frozen on the work order), serials from the shop's sequence,
 * due on the promised ship date; the hardware and packaging of each unit's BOM reserved for its
 * work order. Pipe is reserved later, when a cut run is published. A revision with no cut parts
 * (a spare-parts pack) skips the benches and goes straight to packing.
 *
 * The order row is locked first, so two planners releasing the same order queue and the second is
 * told it is released; parts are then locked in id order by the stock ledger, so concurrent
 * releases never reserve more than is free. When stock is short, the release is refused (409,
 * naming each short part) unless `allowShort`, which reserves what is free, unit by unit in serial
 * order, and records the rest as a shortage on the timeline (the shortages page computes it live).
 * An order on hold is refused (409). `actor` is null when the system releases it (auto-release).
 */
export async function releaseOrder(
  tx: Tx,
  orderId: string,
  options: { allowShort: boolean; automatic?: boolean },
  actor: Actor | null,
): Promise<ReleasedOrder> {
  const order = await lockOrder(tx, orderId)
  if (!order) throw new NotFound('No such order')
  const blocker = releaseBlocker(order)
  if (blocker) throw blocker

  const lines = await mapLinesToKits(tx, order, actor)
  const revisions = new Map((await selectNewestReleasedRevisions(tx, [...new Set(lines.map((l) => l.kitId!))])).map((r) => [r.kitId, r]))
  for (const line of lines) if (!revisions.has(line.kitId!)) throw noReleasedRevision(order, line)
  const revisionIds = [...new Set([...revisions.values()].map((r) => r.id))]
  const bom = await selectBomLines(tx, revisionIds)
  const withCuts = await selectRevisionsWithCutParts(tx, revisionIds)

  // What the whole order needs, against what is free once the parts are locked.
  const needed = orderNeeds(lines, revisions, bom)
  const free = await freeStock(tx, [...needed.keys()], { lock: true })
  if (!options.allowShort) refuseIfShort(order, needed, free)

  const { units, serials, created } = await createWorkOrders(tx, order, lines, revisions, withCuts)
  const reservedByPart = await reserveUnitBoms(tx, order, created, bom, needed, free, actor)
  await markReleased(tx, order.id)
  const shortages: ReleaseShortage[] = [...needed.entries()]
    .map(([partId, n]) => ({
      partId,
      sku: n.sku,
      name: n.name,
      needed: n.quantity,
      reserved: reservedByPart.get(partId) ?? 0,
      short: n.quantity - (reservedByPart.get(partId) ?? 0),
    }))
    .filter((s) => s.short > 0)
  await recordRelease(tx, order, units, created, shortages, options, actor)
  const bySerial = new Map(units.map((u, i) => [formatSerial(serials[i]!), u.rev]))
  return {
    orderId: order.id,
    number: order.number,
    workOrders: created.map((w) => ({
      id: w.id,
      serial: w.serial,
      status: w.status,
      kitSku: bySerial.get(w.serial)!.kitSku,
      revisionCode: bySerial.get(w.serial)!.code,
    })),
    shortages,
  }
}

/**
 * The order's lines, each mapped to a kit: a line that mapped to no kit when it came in may map now,
 * if the planner has since set the store product on a kit (noted on the timeline); one that still
 * maps to none refuses the release.
 */
async function mapLinesToKits(tx: Tx, order: OrderRow, actor: Actor | null): Promise<LineRow[]> {
  const lines = await selectLines(tx, order.id)
  const unmapped = lines.filter((l) => l.kitId === null)
  const byProduct = new Map(
    (
      await selectKitsByStoreProduct(
        tx,
        unmapped.flatMap((l) => (l.storeProductId ? [l.storeProductId] : [])),
      )
    ).map((k) => [k.storeProductId, k]),
  )
  for (const line of unmapped) {
    const kit = line.storeProductId ? byProduct.get(line.storeProductId) : undefined
    if (!kit) throw unmappedLine(order, line)
    await mapLineToKit(tx, line.id, kit)
    Object.assign(line, { kitId: kit.id, sku: kit.sku, description: kit.name })
    await addOrderEvent(tx, { orderId: order.id, kind: 'note', message: `Line ${line.lineNo} now maps to kit ${kit.sku} (${kit.name})`, actor })
  }
  return lines
}

type Needs = ReturnType<typeof orderNeeds>

/** Refuses the release (409, naming each short part) when free stock does not cover what the order needs. */
function refuseIfShort(order: OrderRow, needed: Needs, free: ReadonlyMap<string, number>) {
  const short = [...needed.entries()].filter(([partId, n]) => n.quantity > Math.max(0, free.get(partId) ?? 0))
  if (short.length === 0) return
  const words = short.map(([partId, n]) => `${n.sku} ${n.name}: needs ${n.quantity}, ${Math.max(0, free.get(partId) ?? 0)} free`)
  const fields = Object.fromEntries(short.map(([partId, n]) => [shortageFieldKey(n.sku), `Needs ${n.quantity}, ${Math.max(0, free.get(partId) ?? 0)} free`]))
  throw new Conflict(
    `Not enough stock to release order ${order.number}: ${words.join('; ')}. Receive stock, or release anyway with the shortage recorded.`,
    fields,
  )
}

/** One work order per unit, serials in line order; a revision with no cut parts goes straight to packing. */
async function createWorkOrders(tx: Tx, order: OrderRow, lines: LineRow[], revisions: ReadonlyMap<string, Revision>, withCuts: ReadonlySet<string>) {
  const units = lines.flatMap((line) => Array.from({ length: line.quantity }, () => ({ line, rev: revisions.get(line.kitId!)! })))
  const serials = (await nextSerials(tx, units.length)).sort((a, b) => a - b)
  const created = await insertWorkOrders(
    tx,
    units.map(({ line, rev }, i) => ({
      serial: formatSerial(serials[i]!),
      orderId: order.id,
      orderLineId: line.id,
      kitRevisionId: rev.id,
      status: withCuts.has(rev.id) ? ('waiting_cut' as const) : ('built' as const),
      dueDate: order.promisedShipDate,
    })),
  )
  return { units, serials, created }
}

type CreatedWorkOrder = Awaited<ReturnType<typeof insertWorkOrders>>[number]

/** Reserves each unit's BOM for its work order; what is free goes to the lowest serials first. Returns what each part got. */
async function reserveUnitBoms(
  tx: Tx,
  order: OrderRow,
  created: CreatedWorkOrder[],
  bom: readonly BomRow[],
  needed: Needs,
  free: ReadonlyMap<string, number>,
  actor: Actor | null,
) {
  const remaining = new Map([...needed.keys()].map((partId) => [partId, Math.max(0, free.get(partId) ?? 0)]))
  const reservedByPart = new Map<string, number>()
  for (const wo of created) {
    const lines = bom
      .filter((b) => b.revisionId === wo.kitRevisionId)
      .map((b) => {
        const quantity = Math.min(b.quantity, remaining.get(b.partId) ?? 0)
        remaining.set(b.partId, (remaining.get(b.partId) ?? 0) - quantity)
        reservedByPart.set(b.partId, (reservedByPart.get(b.partId) ?? 0) + quantity)
        return { partId: b.partId, quantity, stickLength: null }
      })
      .filter((l) => l.quantity > 0)
    if (lines.length > 0) await reserveStock(tx, { workOrderId: wo.id, lines, reason: `Order ${order.number}, unit ${wo.serial}` }, actor)
  }
  return reservedByPart
}

/** The timeline's record of the release, and of the parts still short when released anyway. */
async function recordRelease(
  tx: Tx,
  order: OrderRow,
  units: { rev: Revision }[],
  created: CreatedWorkOrder[],
  shortages: ReleaseShortage[],
  options: { automatic?: boolean },
  actor: Actor | null,
) {
  const codes = [...new Set(units.map((u) => `${u.rev.kitSku} rev ${u.rev.code}`))].join(', ')
  const range = created.length === 1 ? created[0]!.serial : `${created[0]!.serial} to ${created.at(-1)!.serial}`
  const packs = created.filter((w) => w.status === 'built').length
  await addOrderEvent(tx, {
    orderId: order.id,
    kind: 'released',
    message:
      `${options.automatic ? 'Released automatically when paid (shop setting)' : 'Released'} into ${created.length} work order${created.length === 1 ? '' : 's'} (${range}; ${codes}). Hardware and packaging reserved; pipe is reserved when a cut run is published.` +
      (packs > 0 ? ` ${packs} spare-parts unit${packs === 1 ? ' goes' : 's go'} straight to packing.` : ''),
    data: { workOrders: created.map((w) => w.serial) },
    actor,
  })
  if (shortages.length > 0) {
    await addOrderEvent(tx, {
      orderId: order.id,
      kind: 'shortage',
      message: `Released with parts short: ${shortages.map((s) => `${s.sku} ${s.name} short ${s.short} of ${s.needed}`).join('; ')}. The units wait for parts; see the shortages page.`,
      data: { shortages },
      actor,
    })
  }
}

/**
 * What a bulk release would do, without doing it: the orders in the turn they would get stock (rush
 * first, then the oldest promise), what each would take, and which would be refused and why. Read in
 * one transaction so the picture is consistent; nothing is written or locked.
 */
export async function previewRelease(db: Db, input: ReleaseOrders): Promise<ReleasePreview> {
  return db.transaction(async (tx) => {
    const candidates: ReleaseCandidate[] = []
    const missing: string[] = []
    for (const orderId of [...new Set(input.orderIds)]) {
      const order = await selectOrderForRelease(tx, orderId)
      if (!order) {
        missing.push(orderId)
        continue
      }
      const base = { orderId, number: order.number, priority: order.priority, promisedShipDate: order.promisedShipDate, placedAt: order.placedAt.toISOString() }
      const blocker = releaseBlocker(order)
      if (blocker) {
        candidates.push({ ...base, blocked: blocker.message, needs: [] })
        continue
      }
      const lines = await selectLines(tx, order.id)
      const byProduct = new Map(
        (
          await selectKitsByStoreProduct(
            tx,
            lines.flatMap((l) => (l.kitId === null && l.storeProductId ? [l.storeProductId] : [])),
          )
        ).map((k) => [k.storeProductId, k.id]),
      )
      const mapped = lines.map((l) => ({ ...l, kitId: l.kitId ?? (l.storeProductId ? (byProduct.get(l.storeProductId) ?? null) : null) }))
      const revisions = new Map(
        (await selectNewestReleasedRevisions(tx, [...new Set(mapped.flatMap((l) => (l.kitId ? [l.kitId] : [])))])).map((r) => [r.kitId, r]),
      )
      const unmapped = mapped.find((l) => l.kitId === null)
      const unreleased = mapped.find((l) => l.kitId !== null && !revisions.has(l.kitId))
      const why = unmapped ? unmappedLine(order, unmapped) : unreleased ? noReleasedRevision(order, unreleased) : null
      if (why) {
        candidates.push({ ...base, blocked: why.message, needs: [] })
        continue
      }
      const bom = await selectBomLines(tx, [...new Set([...revisions.values()].map((r) => r.id))])
      const needs = [...orderNeeds(mapped, revisions, bom).entries()].map(([partId, n]) => ({ partId, ...n }))
      candidates.push({ ...base, blocked: null, needs })
    }
    const free = await freeStock(tx, [...new Set(candidates.flatMap((c) => c.needs.map((n) => n.partId)))], { lock: false })
    return { plan: planRelease(candidates, free, { allowShort: input.allowShort }), missing }
  })
}

/**
 * Releases each order in its own transaction, in priority order (rush first, then the oldest
 * promised date; see planRelease), so scarce stock goes where it is most needed whatever order the
 * planner ticked them in. The answer lists what was released and what was refused and why; when
 * nothing could be released, the refusal itself is thrown (for one order, its own 409 or 404,
 * naming what is short; for several, one summary with a line per order).
 */
export async function releaseOrders(db: Db, input: ReleaseOrders, actor: Actor): Promise<ReleaseResult> {
  const result: ReleaseResult = { released: [], refused: [] }
  const errors: HttpError[] = []
  for (const orderId of await inPriorityOrder(db, [...new Set(input.orderIds)])) {
    try {
      result.released.push(await db.transaction((tx) => releaseOrder(tx, orderId, { allowShort: input.allowShort }, actor)))
    } catch (err) {
      if (!(err instanceof HttpError)) throw err
      errors.push(err)
      result.refused.push({ orderId, number: null, status: err.status, message: err.message })
    }
  }
  const numbers = await selectOrderNumbersById(
    db,
    result.refused.map((r) => r.orderId),
  )
  for (const r of result.refused) r.number = numbers.get(r.orderId) ?? null
  if (result.released.length === 0) {
    if (errors.length === 1) throw errors[0]!
    const fields = Object.fromEntries(result.refused.map((r) => [`orders.${r.orderId}`, r.message]))
    throw new Conflict(`None of the ${errors.length} orders was released:\n${result.refused.map((r) => `• ${r.message}`).join('\n')}`, fields)
  }
  return result
}

/** The ids sorted as planRelease gives out stock; unknown ids last (they answer 404). */
async function inPriorityOrder(db: Db, ids: string[]): Promise<string[]> {
  const keys = await selectReleaseSortKeys(db, ids)
  const known = keys.map((k) => ({
    orderId: k.id,
    number: k.number,
    priority: k.priority,
    promisedShipDate: k.promisedShipDate,
    placedAt: k.placedAt.toISOString(),
  }))
  known.sort(compareReleasePriority)
  const found = new Set(known.map((k) => k.orderId))
  return [...known.map((k) => k.orderId), ...ids.filter((id) => !found.has(id))]
}
