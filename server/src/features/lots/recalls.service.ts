import Papa from 'papaparse'
import { and, eq, sql } from 'drizzle-orm'
import { neutraliseCsvCell } from '@kitwright/shared/csv'
import type { LotDetail, LotList, LotListQuery, NotifyRecall, NotifyRecallResult, RecallUnit } from '@kitwright/shared/lots'
import { ON_HAND_MOVE_KINDS } from '@kitwright/shared/stock'
import type { Db, Tx } from '../../db/client'
import { lotRecallNotices, stockLots } from '../../db/schema/index'
import type { Deps } from '../../deps'
import type { SessionUser } from '../../lib/auth'
import { NotFound } from '../../lib/http-errors'
import { queueMail } from '../mail/mail.service'
import { addOrderEvent } from '../orders/orders.service'
import { getShopSettings } from '../settings/settings.service'
import { recallNoticeContent, recallPurpose } from './recall-mail'

type Conn = Db | Tx
const ON_HAND = sql.join(
  ON_HAND_MOVE_KINDS.map((k) => sql`${k}`),
  sql`, `,
)
const iso = (v: Date | string) => new Date(v).toISOString()

interface LotRecord extends Record<string, unknown> {
  id: string
  code: string
  partId: string
  sku: string
  name: string
  electrical: boolean
  firstReceivedAt: Date | string
  received: number
  onHand: number
  units: number
}

function lotsSql(where: ReturnType<typeof sql>) {
  return sql`
    select l.id, l.code, p.id as "partId", p.sku, p.name, p.electrical, l.first_received_at as "firstReceivedAt",
      coalesce((select sum(m.quantity) from stock_moves m where m.lot_id = l.id and m.kind = 'receive'), 0)::int as received,
      coalesce((select sum(m.quantity) from stock_moves m where m.lot_id = l.id and m.kind in (${ON_HAND})), 0)::int as "onHand",
      (select count(distinct u.work_order_id) from unit_lots u where u.lot_id = l.id and u.undone_at is null)::int as units
    from stock_lots l join parts p on p.id = l.part_id
    where ${where}
    order by l.first_received_at desc, p.sku, l.code
    limit 500`
}

const toSummary = (r: LotRecord) => ({
  id: r.id,
  code: r.code,
  part: { id: r.partId, sku: r.sku, name: r.name },
  firstReceivedAt: iso(r.firstReceivedAt),
  received: r.received,
  onHand: r.onHand,
  units: r.units,
})

/** The lots page: every lot received (newest first), or those whose code, SKU or part name holds the search. */
export async function listLots(db: Db, query: LotListQuery): Promise<LotList> {
  const like = query.q ? `%${query.q.replace(/[\\%_]/g, (c) => `\\${c}`)}%` : null
  const where = like ? sql`(l.code ilike ${like} or p.sku ilike ${like} or p.name ilike ${like})` : sql`true`
  const rows = (await db.execute<LotRecord>(lotsSql(where))).rows
  return { items: rows.map(toSummary) }
}

interface RecallRecord extends Record<string, unknown> {
  workOrderId: string
  serial: string
  status: RecallUnit['status']
  quantity: number
  fittedAt: Date | string
  orderId: string
  orderNumber: string
  customerName: string
  customerEmail: string
  kitName: string
  shippedAt: Date | string | null
  trackingNumber: string | null
  shipName: string
  shipLine1: string
  shipLine2: string | null
  shipCity: string
  shipRegion: string | null
  shipPostalCode: string
  shipCountry: string
  notifiedAt: Date | string | null
}

/** Every unit with a standing fit of the lot: its order, customer, where it went and when, and whether the customer was told. */
async function recallUnits(db: Conn, lotId: string): Promise<RecallRecord[]> {
  const result = await db.execute<RecallRecord>(sql`
    select w.id as "workOrderId", w.serial, w.status, sum(u.quantity)::int as quantity, min(u.fitted_at) as "fittedAt",
      o.id as "orderId", o.number as "orderNumber", o.customer_name as "customerName", o.customer_email as "customerEmail", k.name as "kitName",
      s.shipped_at as "shippedAt", coalesce(pc.tracking_number, s.tracking_number) as "trackingNumber",
      o.ship_name as "shipName", o.ship_line1 as "shipLine1", o.ship_line2 as "shipLine2", o.ship_city as "shipCity",
      o.ship_region as "shipRegion", o.ship_postal_code as "shipPostalCode", o.ship_country as "shipCountry",
      (select min(e.created_at) from order_events e where e.order_id = o.id and e.kind = 'recall' and e.data->>'lotId' = ${lotId}::text) as "notifiedAt"
    from unit_lots u
    join work_orders w on w.id = u.work_order_id
    join orders o on o.id = w.order_id
    join kit_revisions r on r.id = w.kit_revision_id
    join kits k on k.id = r.kit_id
    left join lateral (
      select pc.tracking_number, pc.shipment_id from parcels pc join shipments sh on sh.id = pc.shipment_id
      where w.id = any(pc.work_order_ids) and sh.status = 'shipped' order by sh.shipped_at limit 1
    ) pc on true
    left join shipments s on s.id = pc.shipment_id
    where u.lot_id = ${lotId} and u.undone_at is null
    group by w.id, o.id, k.name, s.shipped_at, s.tracking_number, pc.tracking_number
    order by o.number, w.serial
  `)
  return result.rows
}

function toRecallUnit(r: RecallRecord): RecallUnit {
  return {
    workOrderId: r.workOrderId,
    serial: r.serial,
    status: r.status,
    quantity: r.quantity,
    fittedAt: iso(r.fittedAt),
    order: { id: r.orderId, number: r.orderNumber },
    customer: { name: r.customerName, email: r.customerEmail },
    shippedAt: r.shippedAt === null ? null : iso(r.shippedAt),
    trackingNumber: r.trackingNumber,
    shipTo: {
      name: r.shipName,
      line1: r.shipLine1,
      line2: r.shipLine2,
      city: r.shipCity,
      region: r.shipRegion,
      postalCode: r.shipPostalCode,
      country: r.shipCountry,
    },
    notifiedAt: r.notifiedAt === null ? null : iso(r.notifiedAt),
  }
}

async function findLot(db: Conn, lotId: string): Promise<LotRecord> {
  const [lot] = (await db.execute<LotRecord>(lotsSql(sql`l.id = ${lotId}`))).rows
  if (!lot) throw new NotFound('No such lot: pick it again from the lots page')
  return lot
}

/** A lot, its receipts and every unit built with it. */
export async function lotDetail(db: Conn, lotId: string): Promise<LotDetail> {
  const lot = await findLot(db, lotId)
  const units = await recallUnits(db, lotId)
  const receipts = await db.execute<{ quantity: number; reference: string | null; at: Date | string; byId: string | null; byName: string | null }>(sql`
    select m.quantity, m.reference, m.created_at as at, us.id as "byId", us.name as "byName"
    from stock_moves m left join users us on us.id = m.created_by
    where m.lot_id = ${lotId} and m.kind = 'receive' order by m.created_at, m.id`)
  const emails = new Set(units.map((u) => u.customerEmail.toLowerCase()))
  // A customer counts as told once every order of theirs with a unit of the lot has been told.
  const untold = new Set(units.filter((u) => u.notifiedAt === null).map((u) => u.customerEmail.toLowerCase()))
  return {
    ...toSummary(lot),
    receipts: receipts.rows.map((r) => ({
      quantity: r.quantity,
      reference: r.reference,
      at: iso(r.at),
      by: r.byId && r.byName ? { id: r.byId, name: r.byName } : null,
    })),
    recall: units.map(toRecallUnit),
    customers: emails.size,
    customersNotified: emails.size - untold.size,
  }
}

export const RECALL_CSV_HEADER = [
  'Lot',
  'Part SKU',
  'Part',
  'Serial',
  'Unit status',
  'Quantity fitted',
  'Fitted at',
  'Order',
  'Customer',
  'E-mail',
  'Shipped at',
  'Tracking',
  'Ship to',
  'Address',
  'City',
  'Region',
  'Postal code',
  'Country',
  'Customer told at',
]

/** Every unit built with the lot, as CSV: text cells neutralised so no cell runs as a spreadsheet formula. */
export async function recallCsv(db: Db, lotId: string): Promise<{ csv: string; code: string }> {
  const detail = await lotDetail(db, lotId)
  const data = detail.recall.map((u) =>
    [
      detail.code,
      detail.part.sku,
      detail.part.name,
      u.serial,
      u.status,
      u.quantity,
      u.fittedAt,
      u.order.number,
      u.customer.name,
      u.customer.email,
      u.shippedAt ?? '',
      u.trackingNumber ?? '',
      u.shipTo.name,
      [u.shipTo.line1, u.shipTo.line2].filter(Boolean).join(', '),
      u.shipTo.city,
      u.shipTo.region ?? '',
      u.shipTo.postalCode,
      u.shipTo.country,
      u.notifiedAt ?? '',
    ].map((cell) => (typeof cell === 'string' ? neutraliseCsvCell(cell) : cell)),
  )
  // A byte-order mark so spreadsheet programs read the file as UTF-8.
  return { csv: '\ufeff' + Papa.unparse({ fields: RECALL_CSV_HEADER, data }, { newline: '\r\n' }), code: detail.code }
}

/**
 * "Tell the customers": one notice per customer (by e-mail address) with a unit of the lot. The
 * notice row is written first under a unique (lot, customer) key, then its e-mail is queued in the
 * same transaction, so pressing it twice, or two planners at once, mails each customer once. A unit
 * built with the lot later, in an order no notice spoke of, gets its customer one more e-mail on the
 * next press (the notice row keeps the orders told). Every order concerned gets a line on its timeline.
 */
export async function notifyRecall(deps: Pick<Deps, 'db' | 'jobs'>, lotId: string, input: NotifyRecall, actor: SessionUser): Promise<NotifyRecallResult> {
  let queued = 0
  let alreadyTold = 0
  await deps.db.transaction(async (tx) => {
    // One press at a time per lot: the lot row is the lock.
    await tx.select({ id: stockLots.id }).from(stockLots).where(eq(stockLots.id, lotId)).for('update')
    const lot = await findLot(tx, lotId)
    const units = await recallUnits(tx, lotId)
    const { shopName } = await getShopSettings(tx)
    const byCustomer = new Map<string, RecallRecord[]>()
    for (const u of units) byCustomer.set(u.customerEmail.toLowerCase(), [...(byCustomer.get(u.customerEmail.toLowerCase()) ?? []), u])
    for (const [email, all] of [...byCustomer.entries()].sort(([a], [b]) => a.localeCompare(b))) {
      // Orders an earlier notice to this customer already spoke of are not told again.
      const [earlier] = await tx
        .select()
        .from(lotRecallNotices)
        .where(and(eq(lotRecallNotices.lotId, lotId), eq(lotRecallNotices.customerEmail, email)))
      const told = new Set(earlier?.orderIds ?? [])
      const theirs = all.filter((u) => !told.has(u.orderId))
      if (theirs.length === 0) {
        alreadyTold += 1
        continue
      }
      const orderIds = [...new Set(theirs.map((u) => u.orderId))]
      let noticeId: string
      if (earlier) {
        await tx
          .update(lotRecallNotices)
          .set({ orderIds: [...earlier.orderIds, ...orderIds] })
          .where(eq(lotRecallNotices.id, earlier.id))
        noticeId = earlier.id
      } else {
        const [notice] = await tx
          .insert(lotRecallNotices)
          .values({ lotId, customerEmail: email, orderIds, queuedBy: actor.id })
          .returning({ id: lotRecallNotices.id })
        noticeId = notice!.id
      }
      const first = theirs[0]!
      const content = recallNoticeContent({
        shopName,
        customerName: first.customerName,
        part: { sku: lot.sku, name: lot.name, electrical: lot.electrical },
        lotCode: lot.code,
        units: theirs.map((u) => ({
          serial: u.serial,
          orderNumber: u.orderNumber,
          kitName: u.kitName,
          shipped: u.shippedAt !== null || u.status === 'shipped',
        })),
        message: input.message,
      })
      // The outbox keeps one message per order and purpose: the first order not yet told carries it.
      const mailId = await queueMail(tx, deps.jobs, { to: first.customerEmail, ...content, orderId: first.orderId, purpose: recallPurpose(lotId) })
      if (!earlier) await tx.update(lotRecallNotices).set({ mailId }).where(eq(lotRecallNotices.id, noticeId))
      const serialsOf = (orderId: string) =>
        theirs
          .filter((u) => u.orderId === orderId)
          .map((u) => u.serial)
          .join(', ')
      for (const orderId of orderIds) {
        await addOrderEvent(tx, {
          orderId,
          kind: 'recall',
          message: `Recall of lot ${lot.code} of ${lot.sku} ${lot.name}: ${serialsOf(orderId)} built with it; notice e-mailed to ${first.customerEmail}`,
          data: { lotId, mailId, serials: serialsOf(orderId).split(', ') },
          actor,
        })
      }
      queued += 1
    }
  })
  return { queued, alreadyTold, detail: await lotDetail(deps.db, lotId) }
}
