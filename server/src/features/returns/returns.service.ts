import { randomUUID } from 'node:crypto'
import { and, asc, desc, eq, inArray, isNull, sql, type SQL } from 'drizzle-orm'
import { LabelAddressSchema } from '@kitwright/shared/address'
import { formatDateTime } from '@kitwright/shared/dates'
import { LENGTH_BASE_PER_MM } from '@kitwright/shared/domain/units'
import { DEFAULT_RETURN_REASONS } from '@kitwright/shared/returns-status'
import type { BuyReturnLabel, DecideReturnSchema, DisposeReturnSchema, OpenReturnSchema, ReturnLookup, ReturnReasons, UpdateReturnReasonsSchema } from '@kitwright/shared/returns'
import { RETURN_DISPOSITION_LABELS, RETURN_STATUS_LABELS } from '@kitwright/shared/status-words'
import { z } from 'zod'
import type { Db, Tx } from '../../db/client'
import {
  buildStepTicks,
  kitRevisions,
  kits,
  orderLines,
  orders,
  parcels,
  returnReasons,
  returns,
  reworkEntries,
  shipments,
  shopSettings,
  workOrders,
  type ReturnRow,
  type WorkOrderRow,
} from '../../db/schema/index'
import type { SessionUser } from '../../lib/auth'
import { BadRequest, Conflict, NotFound, Unavailable } from '../../lib/http-errors'
import { protocolOf } from '../build/build-page'
import { findRevisionWithKit, findWorkOrderBySerial, lockWorkOrder, stepsOfRevision } from '../build/build.queries'
import { addOrderEvent, createOrder } from '../orders/orders.service'
import { bomOfRevisions } from '../pack/pack.queries'
import { checkShipTo } from '../pack/pack.service'
import { splitShipMovesByLot } from '../lots/lots.queries'
import { insertMoves, lockParts } from '../stock/stock.queries'
import { reserveStock } from '../stock/stock.service'
import { shipFromOf } from '../settings/settings.service'
import type { Carrier, CarrierLabel } from '../shipping/carrier'
import { payForLabel, withLabelLock, type LabelDeps } from '../shipping/labels.service'
import { releaseOrder } from '../work-orders/release.service'

/** A moment in a message the way the rest of Kitwright writes it; messages come from the server, so in UTC and said so. */
const momentOf = (d: Date) => `${formatDateTime(d, 'UTC')} UTC`

type OpenReturn = z.infer<typeof OpenReturnSchema>
type DecideReturn = z.infer<typeof DecideReturnSchema>
type DisposeReturn = z.infer<typeof DisposeReturnSchema>

const money = (cents: number, currency: string) => `${(cents / 100).toFixed(2)} ${currency}`

// ── Reasons ────────────

/** The shop's reasons in order; the defaults while the owner has set none. */
export async function listReturnReasons(db: Db | Tx): Promise<ReturnReasons> {
  const rows = await db.select({ label: returnReasons.label }).from(returnReasons).orderBy(asc(returnReasons.position))
  if (rows.length === 0) return { reasons: [...DEFAULT_RETURN_REASONS], defaults: true }
  return { reasons: rows.map((r) => r.label), defaults: false }
}

/** Replaces the shop's list. Returns already opened keep the reason they were opened with. */
export async function setReturnReasons(db: Db, input: z.infer<typeof UpdateReturnReasonsSchema>): Promise<ReturnReasons> {
  await db.transaction(async (tx) => {
    // One owner's edit at a time; the list is small and replaced whole.
    await tx.execute(sql`select pg_advisory_xact_lock(hashtextextended('return-reasons', 0))`)
    await tx.delete(returnReasons)
    await tx.insert(returnReasons).values(input.reasons.map((label, position) => ({ label, position })))
  })
  return listReturnReasons(db)
}

// ── Finding the unit ────────────

async function unitsWithKit(db: Db | Tx, where: SQL) {
  return db
    .select({
      wo: workOrders,
      kitSku: kits.sku,
      kitName: kits.name,
      revisionCode: kitRevisions.code,
      orderNumber: orders.number,
      orderShippedAt: orders.shippedAt,
    })
    .from(workOrders)
    .innerJoin(kitRevisions, eq(kitRevisions.id, workOrders.kitRevisionId))
    .innerJoin(kits, eq(kits.id, kitRevisions.kitId))
    .innerJoin(orders, eq(orders.id, workOrders.orderId))
    .where(where)
    .orderBy(asc(workOrders.serial))
}

/** When the unit left in a parcel, if it did. */
async function shippedAtOf(db: Db | Tx, workOrderId: string): Promise<Date | null> {
  const [row] = await db
    .select({ shippedAt: shipments.shippedAt })
    .from(parcels)
    .innerJoin(shipments, eq(shipments.id, parcels.shipmentId))
    .where(and(sql`${workOrderId}::uuid = any(${parcels.workOrderIds})`, eq(shipments.status, 'shipped')))
    .orderBy(desc(shipments.shippedAt))
    .limit(1)
  return row?.shippedAt ?? null
}

/** Why this unit cannot be returned now, in the office's words (null when it can). */
function notReturnable(wo: WorkOrderRow): string | null {
  if (wo.status === 'shipped') return null
  if (wo.status === 'cancelled') return `Unit ${wo.serial} was cancelled and never shipped; there is nothing to return`
  return `Unit ${wo.serial} has not shipped (it is ${wo.status.replace(/_/g, ' ')} in the shop); only a unit the customer has can be returned`
}

/** A scanned serial or order number → the shipped units it names, with any undecided return of each. */
export async function lookupReturnable(db: Db, code: string): Promise<ReturnLookup> {
  const wanted = code.trim()
  let rows = await unitsWithKit(db, sql`upper(${workOrders.serial}) = ${wanted.toUpperCase()}`)
  if (rows.length === 0) {
    const [order] = await db
      .select({ id: orders.id, number: orders.number })
      .from(orders)
      .where(sql`upper(${orders.number}) = ${wanted.toUpperCase()}`)
    if (!order) throw new NotFound(`No unit with serial "${wanted}" and no order numbered "${wanted}": check the label or the packing slip and scan again`)
    rows = (await unitsWithKit(db, eq(workOrders.orderId, order.id))).filter((r) => r.wo.status === 'shipped')
    if (rows.length === 0) throw new Conflict(`Order ${order.number} has no shipped unit; only a unit the customer has can be returned`)
  } else {
    const why = notReturnable(rows[0]!.wo)
    if (why) throw new Conflict(why, { code: why })
  }
  const open = rows.length
    ? await db
        .select({ id: returns.id, number: returns.number, workOrderId: returns.workOrderId })
        .from(returns)
        .where(
          and(
            inArray(
              returns.workOrderId,
              rows.map((r) => r.wo.id),
            ),
            inArray(returns.status, ['awaiting_parcel', 'received']),
          ),
        )
    : []
  const units = []
  for (const r of rows) {
    const o = open.find((x) => x.workOrderId === r.wo.id)
    const shippedAt = (await shippedAtOf(db, r.wo.id)) ?? r.orderShippedAt
    units.push({
      workOrderId: r.wo.id,
      serial: r.wo.serial,
      kitSku: r.kitSku,
      kitName: r.kitName,
      revisionCode: r.revisionCode,
      orderNumber: r.orderNumber,
      shippedAt: shippedAt?.toISOString() ?? null,
      openReturnId: o?.id ?? null,
      openReturnNumber: o?.number ?? null,
    })
  }
  return { code: wanted, units }
}

// ── Opening ────────────

async function lockReturn(tx: Tx, id: string): Promise<ReturnRow | undefined> {
  const [row] = await tx.select().from(returns).where(eq(returns.id, id)).for('update')
  return row
}

/**
 * Opens a return of a shipped unit with one of the shop's reasons. Refused, with nothing written,
 * for an unknown serial, a unit that never shipped, one already back in the shop on a decided return,
 * or one with an undecided return (open that one instead).
 */
export async function openReturn(db: Db, input: OpenReturn, actor: SessionUser): Promise<ReturnRow> {
  return db.transaction(async (tx) => {
    const found = await findWorkOrderBySerial(tx, input.serial)
    if (!found) throw new NotFound(`No unit with serial "${input.serial}": check the label on the unit and type it again`)
    const wo = (await lockWorkOrder(tx, found.id))!
    const why = notReturnable(wo)
    if (why) throw new Conflict(why, { serial: 'Not shipped' })
    const { reasons } = await listReturnReasons(tx)
    const reason = reasons.find((r) => r.toLowerCase() === input.reason.toLowerCase())
    if (!reason)
      throw new BadRequest(
        `"${input.reason}" is not one of the shop's return reasons (${reasons.join(', ')}); choose one, or ask the owner to add it in settings`,
        { reason: "Choose one of the shop's reasons" },
      )
    const earlier = await tx.select().from(returns).where(eq(returns.workOrderId, wo.id)).orderBy(desc(returns.openedAt))
    const undecided = earlier.find((r) => r.status === 'awaiting_parcel' || r.status === 'received')
    if (undecided)
      throw new Conflict(`Unit ${wo.serial} already has return ${undecided.number} (${RETURN_STATUS_LABELS[undecided.status]}); open that one`, {
        serial: `Return ${undecided.number} is open`,
      })
    const kept = earlier.find((r) => r.status === 'replace' || r.status === 'refund')
    if (kept)
      throw new Conflict(`Unit ${wo.serial} came back on return ${kept.number} (${RETURN_STATUS_LABELS[kept.status]}); the customer no longer has it`, {
        serial: `Returned on ${kept.number}`,
      })
    const [{ n }] = (await tx.execute<{ n: string }>(sql`select nextval('return_number_seq')::text as n`)).rows as [{ n: string }]
    const [created] = await tx
      .insert(returns)
      .values({ number: `R-${n}`, workOrderId: wo.id, orderId: wo.orderId, reason, notes: input.notes, openedBy: actor.id })
      .returning()
    await addOrderEvent(tx, {
      orderId: wo.orderId,
      kind: 'return_opened',
      message: `Return ${created!.number} opened for unit ${wo.serial}: ${reason}${input.notes ? ` (${input.notes})` : ''}`,
      data: { returnId: created!.id, serial: wo.serial, reason },
      actor,
    })
    return created!
  })
}

// ── The return label (bought exactly once) ────────────

const ReturnLabelRequestSchema = z.object({
  carrier: z.string(),
  service: z.string(),
  request: z.object({
    from: LabelAddressSchema,
    to: LabelAddressSchema,
    parcels: z.array(z.object({ weightGrams: z.number(), lengthMm: z.number(), widthMm: z.number(), heightMm: z.number() })),
    reference: z.string(),
    isReturn: z.boolean(),
  }),
})
type ReturnLabelRequest = z.infer<typeof ReturnLabelRequestSchema>

function carrierOf(deps: LabelDeps): Carrier {
  if (!deps.carrier) throw new Unavailable('No carrier is set up (CARRIER_API_KEY): return labels cannot be bought')
  return deps.carrier
}

/** The parcel the unit went out in: its box size and weight are what comes back. */
async function outboundParcel(db: Db, workOrderId: string) {
  const [row] = await db
    .select({ p: parcels })
    .from(parcels)
    .innerJoin(shipments, eq(shipments.id, parcels.shipmentId))
    .where(sql`${workOrderId}::uuid = any(${parcels.workOrderIds})`)
    .orderBy(desc(parcels.createdAt))
    .limit(1)
  return row?.p
}

/** Step 1: the purchase recorded as `buying` with a fresh idempotency key and what is bought, before any carrier call. */
async function recordBuying(deps: LabelDeps, ret: ReturnRow, input: BuyReturnLabel): Promise<ReturnRow> {
  const [settings] = await deps.db.select().from(shopSettings).limit(1)
  const from = settings ? shipFromOf(settings) : null
  if (!settings || !from) throw new Conflict('The shop has no ship-from address: an owner sets it in shop settings; the return comes back to it')
  if (!settings.carrierName)
    throw new Conflict('The shop has no carrier set: an owner sets it in shop settings (the carrier name as the shipping service names it)')
  const [order] = await deps.db.select().from(orders).where(eq(orders.id, ret.orderId))
  const [wo] = await deps.db.select().from(workOrders).where(eq(workOrders.id, ret.workOrderId))
  const parcel = await outboundParcel(deps.db, ret.workOrderId)
  if (!order || !wo) throw new NotFound('No such return')
  if (!parcel)
    throw new Conflict(`Unit ${wo.serial} left without a parcel on record, so its size and weight are unknown; the customer sends it back at their own cost`)
  const customer = {
    name: order.shipName,
    line1: order.shipLine1,
    line2: order.shipLine2,
    city: order.shipCity,
    region: order.shipRegion,
    postalCode: order.shipPostalCode,
    country: order.shipCountry,
    phone: order.customerPhone,
  }
  // As the outbound label (shop → customer) with the return flag: the carrier swaps the two.
  const request = {
    from,
    to: customer,
    parcels: [
      {
        weightGrams: parcel.billableGrams,
        lengthMm: parcel.length / LENGTH_BASE_PER_MM,
        widthMm: parcel.width / LENGTH_BASE_PER_MM,
        heightMm: parcel.height / LENGTH_BASE_PER_MM,
      },
    ],
    reference: `${ret.number} ${wo.serial}`,
    isReturn: true,
  }
  await checkShipTo(carrierOf(deps), request, order.number)
  const stored: ReturnLabelRequest = { carrier: settings.carrierName, service: input.service, request }
  return deps.db.transaction(async (tx) => {
    const locked = await lockReturn(tx, ret.id)
    if (!locked) throw new NotFound('No such return')
    if (locked.labelStatus !== 'none') return locked
    const [updated] = await tx
      .update(returns)
      .set({ labelStatus: 'buying', labelKey: randomUUID(), labelRequest: stored, carrierRef: null })
      .where(eq(returns.id, ret.id))
      .returning()
    return updated!
  })
}

async function recordLabel(deps: LabelDeps, ret: ReturnRow, label: CarrierLabel, actor: SessionUser | null) {
  const parcel = label.parcels[0]
  if (!parcel || label.parcels.length !== 1)
    throw new Unavailable(`The carrier sold ${label.parcels.length} parcel labels for one return parcel; ask the office to check the carrier account`)
  await deps.db.transaction(async (tx) => {
    const locked = await lockReturn(tx, ret.id)
    if (!locked || locked.labelStatus !== 'buying' || locked.labelKey !== ret.labelKey) return
    await tx
      .update(returns)
      .set({
        labelStatus: 'bought',
        carrier: label.carrier,
        service: label.service,
        carrierRef: label.carrierRef,
        trackingNumber: parcel.trackingNumber,
        carrierParcelRef: parcel.carrierParcelRef,
        chargeCents: label.chargeCents,
        labelData: { routingCode: label.routingCode },
        labelBoughtAt: new Date(),
        labelBoughtBy: actor?.id ?? null,
      })
      .where(eq(returns.id, ret.id))
    await addOrderEvent(tx, {
      orderId: ret.orderId,
      kind: 'return_label_bought',
      message: `Return label bought for ${ret.number}: ${label.carrier} ${label.service}, tracking ${parcel.trackingNumber}`,
      data: { returnId: ret.id, trackingNumber: parcel.trackingNumber, idempotencyKey: ret.labelKey },
      actor: actor ?? undefined,
    })
  })
}

/** Prepares (with the key), then finds or pays for the label with the same key; a refusal puts the return back to no label. */
async function finishPurchase(deps: LabelDeps, ret: ReturnRow, actor: SessionUser | null, resuming: boolean) {
  const carrier = carrierOf(deps)
  const key = ret.labelKey!
  const stored = ReturnLabelRequestSchema.parse(ret.labelRequest)
  try {
    const { ref, label } = await payForLabel(carrier, {
      key,
      carrierRef: ret.carrierRef,
      request: stored.request,
      choice: { carrier: stored.carrier, service: stored.service },
      resuming,
      saveRef: (carrierRef) =>
        deps.db
          .update(returns)
          .set({ carrierRef })
          .where(and(eq(returns.id, ret.id), eq(returns.labelKey, key))),
    })
    await recordLabel(deps, { ...ret, carrierRef: ref }, label, actor)
  } catch (err) {
    if (err instanceof Conflict) {
      deps.logger.warn({ err, returnId: ret.id }, 'the carrier refused the return label; the return has no label again')
      await deps.db
        .update(returns)
        .set({ labelStatus: 'none', labelKey: null, labelRequest: null, carrierRef: null })
        .where(and(eq(returns.id, ret.id), eq(returns.labelStatus, 'buying'), eq(returns.labelKey, key)))
    } else {
      deps.logger.error({ err, returnId: ret.id, idempotencyKey: key }, 'return label purchase not finished; it stays "buying" and the next try finishes it')
    }
    throw err
  }
}

/**
 * Buys the return's label exactly once, as outbound labels are bought: recorded (`buying`, key, what
 * is bought) before the carrier is called, every call carrying the key, one purchase at a time per
 * return under an advisory lock; a second tap or ten at once end with the one label.
 */
export async function buyReturnLabel(deps: LabelDeps, returnId: string, input: BuyReturnLabel, actor: SessionUser): Promise<void> {
  carrierOf(deps)
  await withLabelLock(deps, `return-label:${returnId}`, async () => {
    const [current] = await deps.db.select().from(returns).where(eq(returns.id, returnId))
    if (!current) throw new NotFound('No such return')
    if (current.labelStatus === 'bought') return
    if (current.labelStatus === 'none' && current.status !== 'awaiting_parcel')
      throw new Conflict(`Return ${current.number} is already back in the shop; it needs no return label`)
    const resuming = current.labelStatus === 'buying'
    const ret = resuming ? current : await recordBuying(deps, current, input)
    if (ret.labelStatus !== 'buying') return
    await finishPurchase(deps, ret, actor, resuming)
  })
}

// ── Receiving ────────────

/**
 * The packer scans the return label's tracking number, the return's number or the unit's serial: the
 * return waiting for that parcel is received. A second scan of the same parcel says when it was received.
 */
export async function receiveReturn(db: Db, code: string, actor: SessionUser): Promise<ReturnRow> {
  const wanted = code.trim().toUpperCase()
  return db.transaction(async (tx) => {
    const [byLabel] = await tx
      .select()
      .from(returns)
      .where(sql`upper(${returns.trackingNumber}) = ${wanted} or upper(${returns.number}) = ${wanted}`)
    let candidate = byLabel
    if (!candidate) {
      const wo = await findWorkOrderBySerial(tx, wanted)
      if (!wo) throw new NotFound(`No return label or serial "${code.trim()}": scan the return label's barcode or the serial on the unit`)
      const [latest] = await tx.select().from(returns).where(eq(returns.workOrderId, wo.id)).orderBy(desc(returns.openedAt)).limit(1)
      if (!latest) throw new NotFound(`Unit ${wo.serial} has no return opened; ask the office to open one before it is received`)
      candidate = latest
    }
    const ret = (await lockReturn(tx, candidate.id))!
    if (ret.status !== 'awaiting_parcel') {
      throw new Conflict(
        `Return ${ret.number} was already received${ret.receivedAt ? ` on ${momentOf(ret.receivedAt)}` : ''}; nothing to do`,
      )
    }
    const [updated] = await tx
      .update(returns)
      .set({ status: 'received', receivedAt: new Date(), receivedBy: actor.id, receivedCode: code.trim() })
      .where(eq(returns.id, ret.id))
      .returning()
    const [wo] = await tx.select({ serial: workOrders.serial }).from(workOrders).where(eq(workOrders.id, ret.workOrderId))
    await addOrderEvent(tx, {
      orderId: ret.orderId,
      kind: 'return_received',
      message: `Return ${ret.number} received back: unit ${wo?.serial ?? ''}`,
      data: { returnId: ret.id, code: code.trim() },
      actor,
    })
    return updated!
  })
}

// ── Deciding ────────────

async function lockUndecided(tx: Tx, returnId: string): Promise<ReturnRow> {
  const ret = await lockReturn(tx, returnId)
  if (!ret) throw new NotFound('No such return')
  if (ret.status === 'awaiting_parcel') throw new Conflict(`Return ${ret.number} has not been received yet: decide once the packer has scanned the parcel in`)
  if (ret.status !== 'received') throw new Conflict(`Return ${ret.number} is already decided (${RETURN_STATUS_LABELS[ret.status]})`)
  return ret
}

/**
 * Repair: the unit goes back to the build bench in rework. The chosen steps' ticks are undone (to be
 * done again), and a rework entry is opened that only a new passing leak test resolves, so the unit
 * is built again only after its retest.
 */
async function decideRepair(tx: Tx, ret: ReturnRow, input: Extract<DecideReturn, { decision: 'repair' }>, actor: SessionUser) {
  const wo = (await lockWorkOrder(tx, ret.workOrderId))!
  const found = await findRevisionWithKit(tx, wo.kitRevisionId)
  if (!found || !protocolOf(found.revision)) {
    throw new Conflict(
      `Unit ${wo.serial} (${found?.kit.sku ?? 'its kit'} rev ${found?.revision.code ?? ''}) has no leak test to repeat, so the build bench cannot repair it; replace it or note a refund`,
    )
  }
  const steps = await stepsOfRevision(tx, wo.kitRevisionId)
  const unknown = input.reopenStepIds.filter((id) => !steps.some((s) => s.id === id))
  if (unknown.length > 0)
    throw new BadRequest(`Only the build steps of ${found.kit.sku} rev ${found.revision.code} can be reopened`, { reopenStepIds: 'Choose steps of this unit' })
  const reopened = steps.filter((s) => input.reopenStepIds.includes(s.id))
  const now = new Date()
  if (reopened.length > 0) {
    await tx
      .update(buildStepTicks)
      .set({ undoneAt: now, undoneBy: actor.id })
      .where(
        and(
          eq(buildStepTicks.workOrderId, wo.id),
          inArray(
            buildStepTicks.buildStepId,
            reopened.map((s) => s.id),
          ),
          isNull(buildStepTicks.undoneAt),
        ),
      )
  }
  const stepWords = reopened.length ? `steps ${reopened.map((s) => s.position).join(', ')} to do again, then a new leak test` : 'a new leak test'
  const [entry] = await tx
    .insert(reworkEntries)
    .values({
      workOrderId: wo.id,
      reason: `Returned on ${ret.number} (${ret.reason}): ${stepWords}${input.note ? `. ${input.note}` : ''}`,
      createdBy: actor.id,
    })
    .returning()
  await tx.update(workOrders).set({ status: 'rework', updatedAt: now }).where(eq(workOrders.id, wo.id))
  // The ledger: the unit's parts are back in the shop (inside the unit, from the lots fitted into it)
  // and held for it, so shipping it again after the repair takes them off once more, net nothing.
  const bom = await bomOfRevisions(tx, [wo.kitRevisionId])
  await lockParts(
    tx,
    bom.map((b) => b.partId),
  )
  const why = `Back in the shop inside unit ${wo.serial} (return ${ret.number}), held for its repair`
  const outward = bom.map((b) => ({
    partId: b.partId,
    kind: 'receive' as const,
    quantity: -b.quantity,
    workOrderId: wo.id,
    reason: why,
    reference: ret.number,
    createdBy: actor.id,
  }))
  await insertMoves(
    tx,
    (await splitShipMovesByLot(tx, wo.id, outward)).map((m) => ({ ...m, quantity: -m.quantity })),
  )
  if (bom.length > 0)
    await reserveStock(tx, { workOrderId: wo.id, lines: bom.map((b) => ({ partId: b.partId, quantity: b.quantity, stickLength: null })), reason: why }, actor)
  // The order owes the customer this unit again: once repaired it is packed and shipped as any unit
  // of a partly shipped order, and the order is shipped again when it leaves.
  await tx
    .update(orders)
    .set({ status: 'partially_shipped', shippedAt: null, updatedAt: now })
    .where(and(eq(orders.id, ret.orderId), eq(orders.status, 'shipped')))
  await tx
    .update(returns)
    .set({
      status: 'repair',
      decision: 'repair',
      decisionNote: input.note,
      decidedAt: now,
      decidedBy: actor.id,
      reopenedStepIds: reopened.map((s) => s.id),
      reworkEntryId: entry!.id,
    })
    .where(eq(returns.id, ret.id))
  await addOrderEvent(tx, {
    orderId: ret.orderId,
    kind: 'return_decided',
    message: `Return ${ret.number}: unit ${wo.serial} back to the build bench for repair (${stepWords}); once ready it goes to the pack bench to ship back`,
    data: { returnId: ret.id, decision: 'repair' },
    actor,
  })
}

/**
 * Replace: a new order of the same kit for the same customer, at no charge, released through the
 * normal release (its unit gets a serial and its stock reserved; short stock is refused unless
 * `allowShort`, as the release does). The whole decision is one transaction: a refused release
 * writes nothing.
 */
async function decideReplace(tx: Tx, ret: ReturnRow, input: Extract<DecideReturn, { decision: 'replace' }>, actor: SessionUser) {
  const [orig] = await tx.select().from(orders).where(eq(orders.id, ret.orderId))
  const [unit] = await tx
    .select({ serial: workOrders.serial, kitSku: kits.sku })
    .from(workOrders)
    .innerJoin(orderLines, eq(orderLines.id, workOrders.orderLineId))
    .innerJoin(kitRevisions, eq(kitRevisions.id, workOrders.kitRevisionId))
    .innerJoin(kits, eq(kits.id, kitRevisions.kitId))
    .where(eq(workOrders.id, ret.workOrderId))
  if (!orig || !unit) throw new NotFound('No such return')
  const { order } = await createOrder(
    tx,
    {
      number: `${orig.number}-${ret.number}`,
      customer: { name: orig.customerName, email: orig.customerEmail, phone: orig.customerPhone ?? undefined },
      shipTo: {
        name: orig.shipName,
        line1: orig.shipLine1,
        line2: orig.shipLine2 ?? undefined,
        city: orig.shipCity,
        region: orig.shipRegion ?? undefined,
        postalCode: orig.shipPostalCode,
        country: orig.shipCountry,
      },
      placedAt: new Date().toISOString(),
      promisedShipDate: undefined,
      note: `Replacement for unit ${unit.serial} of order ${orig.number}, return ${ret.number} (${ret.reason})${input.note ? `: ${input.note}` : ''}`,
      paymentStatus: 'paid',
      currency: orig.currency,
      lines: [{ kitSku: unit.kitSku, quantity: 1, unitPriceCents: 0, storeProductId: undefined, description: undefined }],
    },
    'replacement',
    actor,
  )
  const released = await releaseOrder(tx, order.id, { allowShort: input.allowShort }, actor)
  const made = released.workOrders[0]!
  const now = new Date()
  await tx
    .update(returns)
    .set({
      status: 'replace',
      decision: 'replace',
      decisionNote: input.note,
      decidedAt: now,
      decidedBy: actor.id,
      replacementOrderId: order.id,
      replacementWorkOrderId: made.id,
    })
    .where(eq(returns.id, ret.id))
  await addOrderEvent(tx, {
    orderId: ret.orderId,
    kind: 'return_decided',
    message: `Return ${ret.number}: unit ${unit.serial} replaced by ${made.serial} on order ${order.number}`,
    data: { returnId: ret.id, decision: 'replace', replacementOrderId: order.id, replacementSerial: made.serial },
    actor,
  })
}

/** Refund noted: the store moves the money; Kitwright records how much and the note. */
async function decideRefund(tx: Tx, ret: ReturnRow, input: Extract<DecideReturn, { decision: 'refund' }>, actor: SessionUser) {
  const [orig] = await tx
    .select({ totalCents: orders.totalCents, currency: orders.currency, number: orders.number })
    .from(orders)
    .where(eq(orders.id, ret.orderId))
  if (!orig) throw new NotFound('No such return')
  if (orig.totalCents > 0 && input.amountCents > orig.totalCents) {
    throw new BadRequest(
      `The refund (${money(input.amountCents, orig.currency)}) is more than order ${orig.number} came to (${money(orig.totalCents, orig.currency)}); check the amount`,
      { amountCents: 'More than the order total' },
    )
  }
  const now = new Date()
  await tx
    .update(returns)
    .set({ status: 'refund', decision: 'refund', decisionNote: input.note, refundCents: input.amountCents, decidedAt: now, decidedBy: actor.id })
    .where(eq(returns.id, ret.id))
  await addOrderEvent(tx, {
    orderId: ret.orderId,
    kind: 'return_decided',
    message: `Return ${ret.number}: refund of ${money(input.amountCents, orig.currency)} noted (made through the store): ${input.note}`,
    data: { returnId: ret.id, decision: 'refund', amountCents: input.amountCents },
    actor,
  })
}

/** Decides a received return: repair, replace or refund noted; refused before the parcel is received. */
export async function decideReturn(db: Db, returnId: string, input: DecideReturn, actor: SessionUser): Promise<ReturnRow> {
  return db.transaction(async (tx) => {
    const ret = await lockUndecided(tx, returnId)
    if (input.decision === 'repair') await decideRepair(tx, ret, input, actor)
    else if (input.decision === 'replace') await decideReplace(tx, ret, input, actor)
    else await decideRefund(tx, ret, input, actor)
    return (await lockReturn(tx, ret.id))!
  })
}

// ── What becomes of the returned unit ────────────

/**
 * Records, once, what becomes of a unit that came back and was replaced or refunded: back to stock as
 * a spare (kept whole on the spares shelf under its serial) or scrapped (with the reason). The stock
 * ledger counts parts, not finished units, so neither writes a stock move: the unit's parts left the
 * ledger when it first shipped; the disposition lives on the return, the unit's build record and the
 * order's timeline. The same request again (a double tap, a retry) returns the recorded disposition
 * and writes nothing (`recorded: false`); a different one is refused.
 */
export async function disposeReturnedUnit(db: Db, returnId: string, input: DisposeReturn, actor: SessionUser): Promise<{ ret: ReturnRow; recorded: boolean }> {
  return db.transaction(async (tx) => {
    const ret = await lockReturn(tx, returnId)
    if (!ret) throw new NotFound('No such return')
    const [wo] = await tx.select({ serial: workOrders.serial }).from(workOrders).where(eq(workOrders.id, ret.workOrderId))
    const serial = wo?.serial ?? ''
    if (ret.disposition) {
      const same = ret.disposition === input.disposition && (ret.dispositionNote ?? null) === (input.note ?? null)
      if (same) return { ret, recorded: false }
      throw new Conflict(
        `Unit ${serial} of return ${ret.number} is already recorded as ${RETURN_DISPOSITION_LABELS[ret.disposition].toLowerCase()}${ret.disposedAt ? ` (${momentOf(ret.disposedAt)})` : ''}; it is recorded once`,
      )
    }
    if (ret.status === 'awaiting_parcel')
      throw new Conflict(`Unit ${serial} of return ${ret.number} has not been received yet: the pack bench scans the parcel in first, then the office decides`)
    if (ret.status === 'received')
      throw new Conflict(`Return ${ret.number} is not decided yet: decide replace or refund first, then what becomes of unit ${serial}`)
    if (ret.status === 'repair')
      throw new Conflict(`Unit ${serial} of return ${ret.number} was sent for repair and goes back to the customer; there is nothing to dispose of`)
    const now = new Date()
    const [updated] = await tx
      .update(returns)
      .set({ disposition: input.disposition, dispositionNote: input.note ?? null, disposedAt: now, disposedBy: actor.id })
      .where(eq(returns.id, ret.id))
      .returning()
    await addOrderEvent(tx, {
      orderId: ret.orderId,
      kind: 'return_unit_disposed',
      message:
        input.disposition === 'spare'
          ? `Return ${ret.number}: unit ${serial} back to stock as a spare (kept whole on the spares shelf under its serial)${input.note ? `: ${input.note}` : ''}`
          : `Return ${ret.number}: unit ${serial} scrapped: ${input.note}`,
      data: { returnId: ret.id, serial, disposition: input.disposition },
      actor,
    })
    return { ret: updated!, recorded: true }
  })
}
