import { and, asc, count, desc, eq, inArray, sql } from 'drizzle-orm'
import type { Return, ReturnListRow, ReturnSummary, UnitReturn } from '@kitwright/shared/returns'
import type { Db } from '../../db/client'
import { kitRevisions, kits, orders, returnPhotos, returns, reworkEntries, workOrders, type ReturnRow } from '../../db/schema/index'
import { NotFound } from '../../lib/http-errors'
import type { Storage } from '../../lib/storage'
import { findWorkOrderBySerial, namesOf, stepsOfRevision } from '../build/build.queries'

const PHOTO_URL_SECONDS = 3600

/** One return as its page shows it. */
export async function loadReturn(db: Db, storage: Storage, returnId: string): Promise<Return> {
  const [row] = await db
    .select({
      r: returns,
      wo: workOrders,
      kitSku: kits.sku,
      kitName: kits.name,
      revisionCode: kitRevisions.code,
      orderNumber: orders.number,
      customerName: orders.customerName,
      currency: orders.currency,
    })
    .from(returns)
    .innerJoin(workOrders, eq(workOrders.id, returns.workOrderId))
    .innerJoin(kitRevisions, eq(kitRevisions.id, workOrders.kitRevisionId))
    .innerJoin(kits, eq(kits.id, kitRevisions.kitId))
    .innerJoin(orders, eq(orders.id, returns.orderId))
    .where(eq(returns.id, returnId))
  if (!row) throw new NotFound('No such return')
  const r: ReturnRow = row.r
  const [photos, steps] = await Promise.all([
    db
      .select()
      .from(returnPhotos)
      .where(and(eq(returnPhotos.returnId, r.id), sql`${returnPhotos.uploadedAt} is not null`))
      .orderBy(asc(returnPhotos.uploadedAt)),
    stepsOfRevision(db, row.wo.kitRevisionId),
  ])
  const names = await namesOf(db, [r.openedBy, r.receivedBy, r.decidedBy, r.disposedBy, ...photos.map((p) => p.uploadedBy)])
  const person = (id: string) => ({ id, name: names.get(id) ?? 'Unknown user' })
  const urls = await Promise.all(photos.map((p) => storage.presignGet(p.key, PHOTO_URL_SECONDS).catch(() => null)))

  let repaired: boolean | null = null
  let replacement: NonNullable<Return['decision']>['replacement'] = null
  if (r.decision === 'repair' && r.reworkEntryId) {
    // The repair's rework entry is resolved only by a leak test that passed after the decision.
    const [entry] = await db.select({ resolvedAt: reworkEntries.resolvedAt }).from(reworkEntries).where(eq(reworkEntries.id, r.reworkEntryId))
    repaired = entry?.resolvedAt != null
  }
  if (r.replacementWorkOrderId && r.replacementOrderId) {
    const [made] = await db
      .select({ serial: workOrders.serial, status: workOrders.status, orderNumber: orders.number })
      .from(workOrders)
      .innerJoin(orders, eq(orders.id, workOrders.orderId))
      .where(eq(workOrders.id, r.replacementWorkOrderId))
    if (made)
      replacement = {
        orderId: r.replacementOrderId,
        orderNumber: made.orderNumber,
        workOrderId: r.replacementWorkOrderId,
        serial: made.serial,
        status: made.status,
      }
  }
  const reopened = (r.reopenedStepIds ?? []).flatMap((id) => {
    const s = steps.find((x) => x.id === id)
    return s ? [{ id: s.id, position: s.position, text: s.text }] : []
  })
  return {
    id: r.id,
    number: r.number,
    status: r.status,
    reason: r.reason,
    notes: r.notes,
    unit: { workOrderId: row.wo.id, serial: row.wo.serial, status: row.wo.status, kitSku: row.kitSku, kitName: row.kitName, revisionCode: row.revisionCode },
    order: { id: r.orderId, number: row.orderNumber, customerName: row.customerName, currency: row.currency },
    openedBy: person(r.openedBy),
    openedAt: r.openedAt.toISOString(),
    label: {
      status: r.labelStatus,
      carrier: r.carrier,
      service: r.service,
      trackingNumber: r.trackingNumber,
      chargeCents: r.chargeCents,
      boughtAt: r.labelBoughtAt?.toISOString() ?? null,
    },
    received: r.receivedAt && r.receivedBy ? { at: r.receivedAt.toISOString(), by: person(r.receivedBy), code: r.receivedCode } : null,
    decision:
      r.decision && r.decidedAt && r.decidedBy
        ? {
            kind: r.decision,
            note: r.decisionNote,
            at: r.decidedAt.toISOString(),
            by: person(r.decidedBy),
            reopenedSteps: reopened,
            repaired,
            replacement,
            refundCents: r.refundCents,
          }
        : null,
    disposition:
      r.disposition && r.disposedAt && r.disposedBy
        ? { kind: r.disposition, note: r.dispositionNote, at: r.disposedAt.toISOString(), by: person(r.disposedBy) }
        : null,
    photos: photos.map((p, i) => ({ id: p.id, key: p.key, url: urls[i] ?? null, by: person(p.uploadedBy), at: p.uploadedAt!.toISOString() })),
    steps: steps.map((s) => ({ id: s.id, position: s.position, text: s.text })),
  }
}

/** Returns, newest first; `undecided` is waiting for the parcel or back in the shop. */
export async function listReturns(db: Db, status: string): Promise<ReturnListRow[]> {
  const where =
    status === 'all'
      ? undefined
      : status === 'undecided'
        ? inArray(returns.status, ['awaiting_parcel', 'received'])
        : eq(returns.status, status as ReturnRow['status'])
  const rows = await db
    .select({ r: returns, serial: workOrders.serial, kitSku: kits.sku, revisionCode: kitRevisions.code, orderNumber: orders.number })
    .from(returns)
    .innerJoin(workOrders, eq(workOrders.id, returns.workOrderId))
    .innerJoin(kitRevisions, eq(kitRevisions.id, workOrders.kitRevisionId))
    .innerJoin(kits, eq(kits.id, kitRevisions.kitId))
    .innerJoin(orders, eq(orders.id, returns.orderId))
    .where(where)
    .orderBy(desc(returns.openedAt))
    .limit(500)
  return rows.map((x) => ({
    id: x.r.id,
    number: x.r.number,
    status: x.r.status,
    reason: x.r.reason,
    serial: x.serial,
    kitSku: x.kitSku,
    revisionCode: x.revisionCode,
    orderNumber: x.orderNumber,
    trackingNumber: x.r.trackingNumber,
    openedAt: x.r.openedAt.toISOString(),
  }))
}

/**
 * Returns per kit revision and reason, beside the units of that revision shipped (the share a
 * reason takes of what went out), and how many returns are still undecided.
 */
export async function returnSummary(db: Db): Promise<ReturnSummary> {
  const rows = await db.execute<{ kit_sku: string; kit_name: string; revision_code: string; reason: string; returns: number; shipped: number }>(sql`
    with shipped as (
      select w.kit_revision_id, count(*)::int as n from work_orders w where w.status = 'shipped' or exists (select 1 from returns r where r.work_order_id = w.id) group by w.kit_revision_id
    )
    select k.sku as kit_sku, k.name as kit_name, kr.code as revision_code, r.reason, count(*)::int as returns, coalesce(max(s.n), 0)::int as shipped
    from returns r
    join work_orders w on w.id = r.work_order_id
    join kit_revisions kr on kr.id = w.kit_revision_id
    join kits k on k.id = kr.kit_id
    left join shipped s on s.kit_revision_id = kr.id
    group by k.sku, k.name, kr.code, r.reason
    order by k.sku, kr.code, count(*) desc, r.reason`)
  const [open] = await db
    .select({ n: count() })
    .from(returns)
    .where(inArray(returns.status, ['awaiting_parcel', 'received']))
  return {
    rows: rows.rows.map((r) => ({
      kitSku: r.kit_sku,
      kitName: r.kit_name,
      revisionCode: r.revision_code,
      reason: r.reason,
      returns: Number(r.returns),
      shipped: Number(r.shipped),
    })),
    open: open?.n ?? 0,
  }
}

/** The returns of one unit (by serial), oldest first, for its build record. */
export async function returnsOfSerial(db: Db, serial: string): Promise<UnitReturn[]> {
  const wo = await findWorkOrderBySerial(db, serial.trim())
  if (!wo) throw new NotFound(`No unit with serial "${serial.trim()}"`)
  const rows = await db.select().from(returns).where(eq(returns.workOrderId, wo.id)).orderBy(asc(returns.openedAt))
  const replacementIds = rows.flatMap((r) => (r.replacementWorkOrderId ? [r.replacementWorkOrderId] : []))
  const serials = replacementIds.length
    ? await db.select({ id: workOrders.id, serial: workOrders.serial }).from(workOrders).where(inArray(workOrders.id, replacementIds))
    : []
  return rows.map((r) => ({
    id: r.id,
    number: r.number,
    status: r.status,
    reason: r.reason,
    notes: r.notes,
    openedAt: r.openedAt.toISOString(),
    receivedAt: r.receivedAt?.toISOString() ?? null,
    decidedAt: r.decidedAt?.toISOString() ?? null,
    decisionNote: r.decisionNote,
    replacementSerial: serials.find((s) => s.id === r.replacementWorkOrderId)?.serial ?? null,
    refundCents: r.refundCents,
    disposition: r.disposition,
    dispositionNote: r.dispositionNote,
    disposedAt: r.disposedAt?.toISOString() ?? null,
  }))
}
