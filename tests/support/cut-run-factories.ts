import { randomBytes } from 'node:crypto'
import { and, eq, sql } from 'drizzle-orm'
import type { Db } from '../../server/src/db/client'
import { cutParts, kitRevisions, kits, offcuts, orderLines, orders, parts, stockMoves, workOrders } from '../../server/src/db/schema/index'

/** A released revision of a demo kit (seeded with seedDemo), by kit SKU and revision code. */
export async function revisionOf(db: Db, kitSku: string, code = 'A') {
  const [row] = await db
    .select({ id: kitRevisions.id, kitId: kits.id })
    .from(kitRevisions)
    .innerJoin(kits, eq(kits.id, kitRevisions.kitId))
    .where(and(eq(kits.sku, kitSku), eq(kitRevisions.code, code)))
  if (!row) throw new Error(`no revision ${kitSku} ${code}; seed the demo first`)
  return row
}

/**
 * An order of `count` units of one kit revision, released into work orders waiting to be cut (as
 * the release service will make them), with serials from the shop's sequence.
 */
export async function insertWorkOrders(db: Db, opts: { kitSku: string; revisionCode?: string; count: number; dueDate?: string | null }) {
  const rev = await revisionOf(db, opts.kitSku, opts.revisionCode)
  const tag = randomBytes(3).toString('hex').toUpperCase()
  const [order] = await db
    .insert(orders)
    .values({
      number: `T-${tag}`,
      source: 'phone',
      status: 'released',
      paymentStatus: 'paid',
      customerName: 'Ada Fernhill',
      customerEmail: 'ada@grower.example',
      shipName: 'Ada Fernhill',
      shipLine1: '12 Orchard Row',
      shipCity: 'Millbrook',
      shipPostalCode: '00000',
      shipCountry: 'US',
      placedAt: new Date(),
    })
    .returning()
  const [line] = await db
    .insert(orderLines)
    .values({ orderId: order!.id, lineNo: 1, kitId: rev.kitId, sku: opts.kitSku, description: opts.kitSku, quantity: opts.count })
    .returning()
  const rows = []
  for (let i = 0; i < opts.count; i++) {
    const [wo] = await db
      .insert(workOrders)
      .values({
        serial: sql`nextval('work_order_serial_seq')::text`,
        orderId: order!.id,
        orderLineId: line!.id,
        kitRevisionId: rev.id,
        dueDate: opts.dueDate ?? null,
      })
      .returning()
    rows.push(wo!)
  }
  return rows
}

/** An offcut on the rack, with its offcut_in move, as the cut bench stocks one. */
export async function insertOffcut(db: Db, partSku: string, length: number) {
  const [part] = await db.select().from(parts).where(eq(parts.sku, partSku))
  const [offcut] = await db.insert(offcuts).values({ partId: part!.id, length }).returning()
  await db.insert(stockMoves).values({ partId: part!.id, kind: 'offcut_in', quantity: 1, offcutId: offcut!.id })
  return offcut!
}

/**
 * A kit with a released revision A whose only pipe is the given cut parts (lengths in base units)
 * of `pipeSku` (default the demo's 1/2 in PVC), for runs with many equal or many different pieces.
 */
export async function insertCutKit(db: Db, opts: { sku: string; cutParts: { label: string; length: number; quantity: number }[]; pipeSku?: string }) {
  const [pipe] = await db.select().from(parts).where(eq(parts.sku, opts.pipeSku ?? 'PVC-050-S40'))
  if (!pipe) throw new Error('no pipe part; seed the demo first')
  const [kit] = await db.insert(kits).values({ sku: opts.sku, name: `Test kit ${opts.sku}` }).returning()
  const [rev] = await db.insert(kitRevisions).values({ kitId: kit!.id, code: 'A', status: 'released', releasedAt: new Date() }).returning()
  await db.insert(cutParts).values(opts.cutParts.map((c, i) => ({ revisionId: rev!.id, partId: pipe.id, label: c.label, length: c.length, quantity: c.quantity, position: i })))
  return { kitId: kit!.id, revisionId: rev!.id, sku: opts.sku }
}
