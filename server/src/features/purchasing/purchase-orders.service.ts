import { and, asc, desc, eq, inArray, sql } from 'drizzle-orm'
import { draftLines, lineTotal, movingAverageCost } from '@kitwright/shared/domain/purchase-draft'
import { formatMoney } from '@kitwright/shared/money'
import type { DraftFromShortagesResult, PurchaseOrder, PurchaseOrderListQuery, UpdatePurchaseOrder } from '@kitwright/shared/purchasing'
import type { Db, Tx } from '../../db/client'
import {
  parts,
  purchaseOrderLines,
  purchaseOrderReceipts,
  purchaseOrders,
  shopSettings,
  supplierParts,
  suppliers,
  type PurchaseOrderLineRow,
  type PurchaseOrderRow,
} from '../../db/schema/index'
import type { Deps } from '../../deps'
import { BadRequest, Conflict, NotFound } from '../../lib/http-errors'
import { purchaseOrderPdf } from '../labels/purchase-order.pdf'
import { queueMail } from '../mail/mail.service'
import { shipFromOf } from '../settings/settings.service'
import { selectShortages } from '../work-orders/shortages.queries'
import { PURCHASE_ORDER_STATUS_WORDS } from '@kitwright/shared/purchasing-status'
import { statusInSentence } from '@kitwright/shared/status-words'

type Conn = Db | Tx

/** Who acts: recorded on drafts and receipts. */
export interface Actor {
  id: string
  name: string
}

function today(): string {
  return new Date().toISOString().slice(0, 10)
}

function addDays(day: string, days: number): string {
  const d = new Date(`${day}T00:00:00Z`)
  d.setUTCDate(d.getUTCDate() + days)
  return d.toISOString().slice(0, 10)
}

function outstandingOf(l: PurchaseOrderLineRow): number {
  return l.closedShortReason !== null ? 0 : Math.max(0, l.quantity - l.received)
}

/** Purchase orders with their lines and supplier, in the order of `rows`. */
async function toPurchaseOrders(db: Conn, rows: PurchaseOrderRow[]): Promise<PurchaseOrder[]> {
  if (rows.length === 0) return []
  const ids = rows.map((r) => r.id)
  const [lines, sups] = await Promise.all([
    db
      .select({ line: purchaseOrderLines, sku: parts.sku, name: parts.name, supplierSku: supplierParts.supplierSku, supplierId: purchaseOrders.supplierId })
      .from(purchaseOrderLines)
      .innerJoin(parts, eq(parts.id, purchaseOrderLines.partId))
      .innerJoin(purchaseOrders, eq(purchaseOrders.id, purchaseOrderLines.purchaseOrderId))
      .leftJoin(supplierParts, and(eq(supplierParts.partId, purchaseOrderLines.partId), eq(supplierParts.supplierId, purchaseOrders.supplierId)))
      .where(inArray(purchaseOrderLines.purchaseOrderId, ids))
      .orderBy(asc(purchaseOrderLines.createdAt), asc(parts.sku)),
    db
      .select()
      .from(suppliers)
      .where(inArray(suppliers.id, [...new Set(rows.map((r) => r.supplierId))])),
  ])
  const supplierOf = new Map(sups.map((s) => [s.id, s]))
  return rows.map((po) => {
    const mine = lines.filter((l) => l.line.purchaseOrderId === po.id)
    const s = supplierOf.get(po.supplierId)!
    return {
      id: po.id,
      number: po.number,
      status: po.status,
      supplier: { id: s.id, name: s.name, email: s.email, minimumOrderCents: s.minimumOrderCents },
      expectedDate: po.expectedDate,
      note: po.note,
      sentAt: po.sentAt?.toISOString() ?? null,
      sentMailId: po.sentMailId,
      totalCents: mine.reduce((sum, l) => sum + lineTotal(l.line), 0),
      lines: mine.map((l) => ({
        id: l.line.id,
        partId: l.line.partId,
        sku: l.sku,
        name: l.name,
        supplierSku: l.supplierSku,
        stickLength: l.line.stickLength,
        quantity: l.line.quantity,
        unitPriceCents: l.line.unitPriceCents,
        received: l.line.received,
        outstanding: outstandingOf(l.line),
        closedShortReason: l.line.closedShortReason,
      })),
    }
  })
}

export async function listPurchaseOrders(db: Db, q: PurchaseOrderListQuery): Promise<PurchaseOrder[]> {
  const rows = await db
    .select()
    .from(purchaseOrders)
    .where(q.status ? eq(purchaseOrders.status, q.status) : undefined)
    .orderBy(desc(purchaseOrders.createdAt), desc(purchaseOrders.number))
    .limit(500)
  return toPurchaseOrders(db, rows)
}

export async function getPurchaseOrder(db: Conn, id: string): Promise<PurchaseOrder> {
  const rows = await db.select().from(purchaseOrders).where(eq(purchaseOrders.id, id))
  const [po] = await toPurchaseOrders(db, rows)
  if (!po) throw new NotFound('No such purchase order')
  return po
}

async function lockPurchaseOrder(tx: Tx, id: string): Promise<PurchaseOrderRow> {
  const [po] = await tx.select().from(purchaseOrders).where(eq(purchaseOrders.id, id)).for('update')
  if (!po) throw new NotFound('No such purchase order')
  return po
}

/**
 * "Draft purchase orders from shortages": one draft per supplier for every part the shortages page
 * suggests buying (what is already on order is counted there), each rounded up to the supplier's
 * pack and minimum order and priced by their breaks. A part already on a draft, or with no
 * supplier, is skipped with why. All drafts or none.
 */
export async function draftFromShortages(db: Db, actor: Actor): Promise<DraftFromShortagesResult> {
  return db.transaction(async (tx) => {
    // One drafting at a time: two taps make one set of drafts (the second finds the parts on them).
    await tx.execute(sql`select pg_advisory_xact_lock(hashtext('kitwright.purchase-drafts'))`)
    const wanted = (await selectShortages(tx, { only: 'short' })).filter((r) => r.suggestedOrder > 0)
    const skipped: DraftFromShortagesResult['skipped'] = []
    if (wanted.length === 0) return { created: [], skipped }
    const partIds = wanted.map((w) => w.partId)
    const onDraft = await tx
      .select({ partId: purchaseOrderLines.partId, number: purchaseOrders.number })
      .from(purchaseOrderLines)
      .innerJoin(purchaseOrders, eq(purchaseOrders.id, purchaseOrderLines.purchaseOrderId))
      .where(and(eq(purchaseOrders.status, 'draft'), inArray(purchaseOrderLines.partId, partIds)))
    const draftOf = new Map(onDraft.map((d) => [d.partId, d.number]))
    const partRows = await tx.select().from(parts).where(inArray(parts.id, partIds))
    const partOf = new Map(partRows.map((p) => [p.id, p]))
    const offers = await tx.select().from(supplierParts).where(inArray(supplierParts.partId, partIds))
    const bySupplier = new Map<string, typeof wanted>()
    for (const w of wanted) {
      const part = partOf.get(w.partId)!
      if (draftOf.has(w.partId)) skipped.push({ sku: w.sku, reason: `Already on draft ${draftOf.get(w.partId)}` })
      else if (!part.supplierId) skipped.push({ sku: w.sku, reason: 'No supplier: choose one on the Suppliers page' })
      else bySupplier.set(part.supplierId, [...(bySupplier.get(part.supplierId) ?? []), w])
    }
    const sups = bySupplier.size
      ? await tx
          .select()
          .from(suppliers)
          .where(inArray(suppliers.id, [...bySupplier.keys()]))
      : []
    const created: string[] = []
    for (const supplier of sups.sort((a, b) => a.name.localeCompare(b.name))) {
      const rows = bySupplier.get(supplier.id)!
      const lines = draftLines(
        rows.map((w) => {
          const offer = offers.find((o) => o.partId === w.partId && o.supplierId === supplier.id)
          const cost = partOf.get(w.partId)!.unitCostCents
          return {
            partId: w.partId,
            suggested: w.suggestedOrder,
            packSize: offer?.packSize ?? 1,
            priceBreaks: offer?.priceBreaks.length ? offer.priceBreaks : [{ minQuantity: 1, unitPriceCents: cost }],
          }
        }),
        supplier.minimumOrderCents,
      )
      const lead = supplier.leadTimeDays ?? Math.max(0, ...rows.map((w) => partOf.get(w.partId)!.leadTimeDays ?? 0))
      const [po] = await tx
        .insert(purchaseOrders)
        .values({ supplierId: supplier.id, expectedDate: addDays(today(), lead), createdBy: actor.id })
        .returning()
      await tx.insert(purchaseOrderLines).values(
        lines.map((l) => ({
          purchaseOrderId: po!.id,
          partId: l.partId,
          stickLength: rows.find((w) => w.partId === l.partId)?.stickLength ?? null,
          quantity: l.quantity,
          unitPriceCents: l.unitPriceCents,
        })),
      )
      created.push(po!.id)
    }
    const pos = created.length ? await tx.select().from(purchaseOrders).where(inArray(purchaseOrders.id, created)) : []
    const built = await toPurchaseOrders(tx, pos)
    return { created: created.map((id) => built.find((p) => p.id === id)!), skipped }
  })
}

/** A draft's lines, expected date and note, all at once; only a draft can be edited. */
export async function updateDraft(db: Db, id: string, input: UpdatePurchaseOrder): Promise<PurchaseOrder> {
  return db.transaction(async (tx) => {
    const po = await lockPurchaseOrder(tx, id)
    if (po.status !== 'draft') throw new Conflict(`${po.number} is ${statusInSentence(PURCHASE_ORDER_STATUS_WORDS, po.status)}: only a draft can be edited`)
    const ids = [...new Set(input.lines.map((l) => l.partId))]
    if (ids.length !== input.lines.length) {
      const dup = input.lines.findIndex((l, i) => input.lines.findIndex((m) => m.partId === l.partId) !== i)
      throw new BadRequest(`Line ${dup + 1}: that part is on the order twice; put the quantities on one line`, {
        [`lines.${dup}.partId`]: 'On the order twice',
      })
    }
    const found = await tx.select({ id: parts.id }).from(parts).where(inArray(parts.id, ids))
    const missing = input.lines.findIndex((l) => !found.some((f) => f.id === l.partId))
    if (missing >= 0) throw new BadRequest(`Line ${missing + 1}: no such part`, { [`lines.${missing}.partId`]: 'No such part' })
    await tx.delete(purchaseOrderLines).where(eq(purchaseOrderLines.purchaseOrderId, id))
    await tx.insert(purchaseOrderLines).values(input.lines.map((l) => ({ purchaseOrderId: id, ...l })))
    await tx.update(purchaseOrders).set({ expectedDate: input.expectedDate, note: input.note, updatedAt: new Date() }).where(eq(purchaseOrders.id, id))
    return getPurchaseOrder(tx, id)
  })
}

/** A draft, or a sent order nothing has come in on, is called off. */
export async function cancelPurchaseOrder(db: Db, id: string): Promise<PurchaseOrder> {
  return db.transaction(async (tx) => {
    const po = await lockPurchaseOrder(tx, id)
    if (po.status !== 'draft' && po.status !== 'sent')
      throw new Conflict(
        `${po.number} is ${statusInSentence(PURCHASE_ORDER_STATUS_WORDS, po.status)}: only a draft or a sent order with nothing received can be cancelled`,
      )
    await tx.update(purchaseOrders).set({ status: 'cancelled', updatedAt: new Date() }).where(eq(purchaseOrders.id, id))
    return getPurchaseOrder(tx, id)
  })
}

/** The purchase order as a PDF: the shop's identity from the settings, the supplier and the lines. */
export async function purchaseOrderPdfOf(db: Conn, id: string, paper: 'letter' | 'a4'): Promise<{ number: string; pdf: Buffer }> {
  const po = await getPurchaseOrder(db, id)
  const [settings] = await db.select().from(shopSettings).where(eq(shopSettings.id, 1))
  const [supplier] = await db.select().from(suppliers).where(eq(suppliers.id, po.supplier.id))
  const a = settings ? shipFromOf(settings) : null
  const deliverTo = a
    ? [a.name, a.line1, ...(a.line2 ? [a.line2] : []), `${a.city}${a.region ? `, ${a.region}` : ''} ${a.postalCode}`, a.country, ...(a.phone ? [a.phone] : [])]
    : []
  const pdf = await purchaseOrderPdf(
    {
      shopName: settings?.shopName ?? 'Kitwright',
      deliverTo,
      contact: settings?.replyToAddress ?? settings?.mailFromAddress ?? null,
      number: po.number,
      date: (po.sentAt ?? new Date().toISOString()).slice(0, 10),
      expectedDate: po.expectedDate,
      supplier: { name: supplier!.name, contactName: supplier!.contactName, email: supplier!.email, phone: supplier!.phone },
      lines: po.lines.map((l) => ({ sku: l.sku, supplierSku: l.supplierSku, name: l.name, quantity: l.quantity, unitPriceCents: l.unitPriceCents })),
      note: po.note,
      totalCents: po.totalCents,
    },
    paper,
  )
  return { number: po.number, pdf }
}

/**
 * Sends a draft: its PDF goes to the supplier through the mail queue and it becomes sent, in one
 * transaction. The order row is locked and keeps the message id, so a second send (a double tap, a
 * retry after a lost answer) finds it sent and queues nothing: one e-mail per purchase order.
 */
export async function sendPurchaseOrder(deps: Pick<Deps, 'db' | 'jobs'>, id: string): Promise<{ purchaseOrder: PurchaseOrder; alreadySent: boolean }> {
  return deps.db.transaction(async (tx) => {
    const po = await lockPurchaseOrder(tx, id)
    if (po.sentMailId) return { purchaseOrder: await getPurchaseOrder(tx, id), alreadySent: true }
    if (po.status !== 'draft') throw new Conflict(`${po.number} is ${statusInSentence(PURCHASE_ORDER_STATUS_WORDS, po.status)}: only a draft can be sent`)
    const [supplier] = await tx.select().from(suppliers).where(eq(suppliers.id, po.supplierId))
    if (!supplier?.email)
      throw new Conflict(`${supplier?.name ?? 'The supplier'} has no e-mail address: add one on the Suppliers page, then send`, { email: 'Needed to send' })
    const current = await getPurchaseOrder(tx, id)
    if (current.lines.length === 0) throw new Conflict(`${po.number} has no lines: add what to buy first`)
    const expectedDate = po.expectedDate ?? addDays(today(), supplier.leadTimeDays ?? 0)
    await tx.update(purchaseOrders).set({ expectedDate, sentAt: new Date() }).where(eq(purchaseOrders.id, id))
    const { pdf } = await purchaseOrderPdfOf(tx, id, 'letter')
    const [settings] = await tx.select({ shopName: shopSettings.shopName }).from(shopSettings).where(eq(shopSettings.id, 1))
    const shop = settings?.shopName ?? 'Kitwright'
    const lines = current.lines.map((l) => `- ${l.quantity} × ${l.supplierSku ?? l.sku} ${l.name} at ${formatMoney(l.unitPriceCents)}`)
    const mailId = await queueMail(tx, deps.jobs, {
      to: supplier.email,
      subject: `Purchase order ${po.number} from ${shop}`,
      text: [
        `Hello${supplier.contactName ? ` ${supplier.contactName}` : ''},`,
        '',
        `Please find our purchase order ${po.number} attached (total ${formatMoney(current.totalCents)}), wanted by ${expectedDate}:`,
        ...lines,
        '',
        `Please quote ${po.number} on the packing list and the invoice.`,
        '',
        shop,
      ].join('\n'),
      orderId: null,
      purpose: `purchase_order:${po.id}`,
      attachments: [{ filename: `${po.number}.pdf`, contentType: 'application/pdf', content: pdf }],
    })
    await tx.update(purchaseOrders).set({ status: 'sent', sentMailId: mailId, updatedAt: new Date() }).where(eq(purchaseOrders.id, id))
    return { purchaseOrder: await getPurchaseOrder(tx, id), alreadySent: false }
  })
}

/** One line of goods received against a purchase order, as the receiving form or packing list gave it. */
export interface PurchaseReceiptLine {
  partId: string
  quantity: number
  reason: string | null
  closeShort: boolean
  /** Where it sits in the request, for the error's field key (`lines.3.reason`, `rows.4`). */
  field: string
  label: string
}

/**
 * Receives goods against a purchase order inside the caller's transaction. The order and its lines
 * are locked first, so two planners receiving the same line at once are served one after the
 * other: the second sees what the first received. More than still due needs a reason; so does
 * closing a line short. `receive` appends the ledger moves (one per line, in order); then each
 * part's unit cost becomes the moving weighted average of its stock on hand at what was paid, the
 * lines count what came in and the order's state follows (partly received, received).
 */
export async function receiveOnPurchaseOrder<M extends { id: string }>(
  tx: Tx,
  purchaseOrderId: string,
  lines: PurchaseReceiptLine[],
  actor: Actor,
  receive: (references: string) => Promise<M[]>,
): Promise<{ number: string; moves: M[] }> {
  const po = await lockPurchaseOrder(tx, purchaseOrderId)
  if (po.status !== 'sent' && po.status !== 'partly_received') {
    const why = po.status === 'draft' ? 'is still a draft: send it first' : po.status === 'received' ? 'is received in full already' : 'is cancelled'
    throw new Conflict(`${po.number} ${why}; nothing was received`)
  }
  const poLines = await tx
    .select()
    .from(purchaseOrderLines)
    .where(eq(purchaseOrderLines.purchaseOrderId, po.id))
    .orderBy(asc(purchaseOrderLines.id))
    .for('update')
  const fields: Record<string, string> = {}
  const coming = new Map<string, number>()
  const plan = lines.map((l) => {
    const line = poLines.find((p) => p.partId === l.partId)
    if (!line) {
      fields[`${l.field}.partId`] = `${po.number} has no line for ${l.label}`
      return null
    }
    const due = outstandingOf(line) - (coming.get(line.id) ?? 0)
    coming.set(line.id, (coming.get(line.id) ?? 0) + l.quantity)
    if (l.quantity > due && !l.reason) {
      fields[`${l.field}.reason`] =
        due <= 0
          ? `${po.number} expects no more ${l.label} (${line.received} of ${line.quantity} received): give a reason to take ${l.quantity} more, or leave it out`
          : `${po.number} still expects ${due} ${l.label}; ${l.quantity} is ${l.quantity - due} over: give a reason, or receive ${due}`
    }
    if (l.closeShort && !l.reason) fields[`${l.field}.reason`] = `Say why the rest of ${l.label} will not come (closing the line short)`
    return { line, receipt: l }
  })
  const first = Object.values(fields)[0]
  if (first) throw new BadRequest(`Nothing was received: ${first}`, fields)

  // On hand before the receipt, per part, for the moving average (the parts are locked by `receive` too, in the same order).
  const partIds = [...new Set(lines.map((l) => l.partId))].sort()
  await tx.select({ id: parts.id }).from(parts).where(inArray(parts.id, partIds)).orderBy(asc(parts.id)).for('update')
  const before = await tx.execute<{ partId: string; onHand: number; cost: number }>(sql`
    select p.id as "partId", p.unit_cost_cents as "cost",
      coalesce((select sum(m.quantity) from stock_moves m where m.part_id = p.id and m.offcut_id is null
        and m.kind in ('receive', 'adjust', 'consume', 'offcut_in', 'offcut_out', 'ship')), 0)::int as "onHand"
    from parts p where p.id in ${partIds}`)
  const state = new Map(before.rows.map((r) => [r.partId, { onHand: Number(r.onHand), cost: Number(r.cost) }]))

  const moves = await receive(po.number)
  for (const [i, step] of plan.entries()) {
    const { line, receipt } = step!
    const s = state.get(receipt.partId)!
    s.cost = movingAverageCost(s.onHand, s.cost, receipt.quantity, line.unitPriceCents)
    s.onHand += receipt.quantity
    await tx
      .insert(purchaseOrderReceipts)
      .values({ lineId: line.id, quantity: receipt.quantity, stockMoveId: moves[i]?.id ?? null, reason: receipt.reason, createdBy: actor.id })
    await tx
      .update(purchaseOrderLines)
      .set({ received: sql`${purchaseOrderLines.received} + ${receipt.quantity}`, ...(receipt.closeShort ? { closedShortReason: receipt.reason } : {}) })
      .where(eq(purchaseOrderLines.id, line.id))
  }
  for (const [partId, s] of state) await tx.update(parts).set({ unitCostCents: s.cost, updatedAt: new Date() }).where(eq(parts.id, partId))
  const after = await tx.select().from(purchaseOrderLines).where(eq(purchaseOrderLines.purchaseOrderId, po.id))
  const done = after.every((l) => outstandingOf(l) === 0)
  await tx
    .update(purchaseOrders)
    .set({ status: done ? 'received' : 'partly_received', updatedAt: new Date() })
    .where(eq(purchaseOrders.id, po.id))
  return { number: po.number, moves }
}

/** A purchase order found by its number (`PO-00012`, any case), for packing lists that name it. */
export async function findPurchaseOrderByNumber(db: Conn, number: string) {
  const [row] = await db
    .select({
      id: purchaseOrders.id,
      number: purchaseOrders.number,
      supplierId: purchaseOrders.supplierId,
    })
    .from(purchaseOrders)
    .where(sql`upper(${purchaseOrders.number}) = upper(${number})`)
  return row ?? null
}
