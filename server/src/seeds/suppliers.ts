import { and, eq, isNull, sql } from 'drizzle-orm'
import { tables, type Db } from './services'

const { parts, supplierParts, suppliers } = tables

/**
 * The demo shop's suppliers: invented names, people, addresses (the reserved `.example` domain) and
 * 555 phone numbers; any likeness to a real company or person is chance. Lead times, minimum orders,
 * packs and price breaks are invented demo values, not quotes.
 */
const DEMO_SUPPLIERS = [
  { name: 'Ridgeback Pipe & Fitting Supply', contactName: 'Dana Okafor', email: 'orders@ridgeback-pipe.example', phone: '+1 555 0141', leadTimeDays: 3, minimumOrderCents: 5000 },
  { name: 'Fernhollow Irrigation Parts', contactName: 'Milo Brandt', email: 'sales@fernhollow-irrigation.example', phone: '+1 555 0162', leadTimeDays: 14, minimumOrderCents: 10000 },
  { name: 'Brightwater Pumpworks', contactName: 'Priya Lindqvist', email: 'trade@brightwater-pumps.example', phone: '+1 555 0187', leadTimeDays: 21, minimumOrderCents: 20000 },
  { name: 'Cobblestone Bin & Tote', contactName: 'Hal Moreno', email: 'orders@cobblestone-totes.example', phone: '+1 555 0119', leadTimeDays: 10, minimumOrderCents: 15000 },
  { name: 'Tallgrass Packaging Co.', contactName: 'June Akers', email: 'hello@tallgrass-packaging.example', phone: '+1 555 0173', leadTimeDays: 7, minimumOrderCents: 7500 },
] as const

/** Packs and price breaks by SKU prefix; the first break is the part's demo cost. */
const PACKS: { prefix: string; packSize: number; discounts: [number, number][] }[] = [
  { prefix: 'SPR-', packSize: 25, discounts: [[100, 0.9], [500, 0.8]] },
  { prefix: 'CUP-', packSize: 50, discounts: [[500, 0.85]] },
  { prefix: 'CLR-', packSize: 50, discounts: [[500, 0.85]] },
  { prefix: 'PMP-', packSize: 1, discounts: [[10, 0.92], [24, 0.85]] },
  { prefix: 'PKG', packSize: 25, discounts: [[100, 0.9]] },
]

/** Adds the demo suppliers, links each part to the supplier it named, and what each sells; twice changes nothing. */
export async function seedDemoSuppliers(db: Db) {
  for (const s of DEMO_SUPPLIERS) {
    const [found] = await db.select({ id: suppliers.id }).from(suppliers).where(sql`lower(${suppliers.name}) = lower(${s.name})`)
    // A supplier made from a part's name by the migration gets its demo contact details once.
    if (found) await db.update(suppliers).set({
      contactName: s.contactName,
      email: s.email,
      phone: s.phone,
      minimumOrderCents: s.minimumOrderCents,
    }).where(and(eq(suppliers.id, found.id), isNull(suppliers.email)))
    else await db.insert(suppliers).values(s)
  }
  await db.execute(sql`update parts p set supplier_id = s.id from suppliers s where p.supplier_id is null and lower(trim(p.supplier)) = lower(s.name)`)
  const linked = await db.select().from(parts).where(sql`${parts.supplierId} is not null`)
  for (const p of linked) {
    const pack = PACKS.find((k) => p.sku.startsWith(k.prefix))
    // A break that would not lower the price (a part of a few cents) is left out.
    const priceBreaks = [{ minQuantity: 1, unitPriceCents: p.unitCostCents }]
    for (const [minQuantity, f] of pack?.discounts ?? []) {
      const unitPriceCents = Math.round(p.unitCostCents * f)
      if (unitPriceCents < priceBreaks[priceBreaks.length - 1]!.unitPriceCents) priceBreaks.push({ minQuantity, unitPriceCents })
    }
    await db
      .insert(supplierParts)
      .values({ supplierId: p.supplierId!, partId: p.id, supplierSku: `${p.sku.replace(/^[A-Z]+-/, '')}-S`, packSize: pack?.packSize ?? 1, priceBreaks })
      .onConflictDoNothing({ target: [supplierParts.supplierId, supplierParts.partId] })
  }
}
