import { asc, eq, inArray } from 'drizzle-orm'
import { inches } from '@kitwright/shared/domain/units'
import { tables, type Db, type NewStockMoveRow } from './services'
import { DEMO_PART_SKUS } from './catalog'

const { parts, stockLots, stockMoves, users } = tables

const S = DEMO_PART_SKUS

interface OpeningLine {
  sku: string
  quantity: number
  stickLength?: number
  reference: string
  /** The supplier's lot (the pump and the sprayers are lot-tracked), and how many days ago it came in. */
  lot?: { code: string; daysAgo: number }
}

/**
 * The demo shop's opening stock, received from its (invented) suppliers' packing lists; the
 * lot-tracked pump and sprayers by lot. Most parts
 * sit well above their reorder point; the pump (7 against 10) and the PVC primer (2 against 2) are
 * left at or below it so the stock page shows low stock.
 */
const OPENING_STOCK: OpeningLine[] = [
  { sku: S.pipeHalfInch, quantity: 40, stickLength: inches(120), reference: 'RPF-24117' },
  { sku: S.pipeHalfInch, quantity: 12, stickLength: inches(240), reference: 'RPF-24117' },
  { sku: S.elbowHalfInch, quantity: 250, reference: 'RPF-24117' },
  { sku: S.teeHalfInch, quantity: 300, reference: 'RPF-24117' },
  { sku: S.pumpAdapter, quantity: 50, reference: 'RPF-24117' },
  { sku: S.primer, quantity: 2, reference: 'RPF-24117' },
  { sku: S.cement, quantity: 6, reference: 'RPF-24117' },
  // Sprayers and pumps came in two lots each (invented codes as printed on the bags and boxes): the
  // build bench offers the older lot first.
  { sku: S.sprayer, quantity: 200, reference: 'FHI-3284', lot: { code: 'NZ-2608-31', daysAgo: 49 } },
  { sku: S.sprayer, quantity: 400, reference: 'FHI-3391', lot: { code: 'NZ-2610-12', daysAgo: 21 } },
  { sku: S.netCup, quantity: 1000, reference: 'FHI-3391' },
  { sku: S.collar, quantity: 1000, reference: 'FHI-3391' },
  { sku: S.drainFitting, quantity: 60, reference: 'FHI-3391' },
  { sku: S.grommet, quantity: 60, reference: 'FHI-3391' },
  { sku: S.tubing, quantity: 200, reference: 'FHI-3391' },
  { sku: S.pump, quantity: 3, reference: 'BWP-0790', lot: { code: 'BW-2609-114', daysAgo: 35 } },
  { sku: S.pump, quantity: 4, reference: 'BWP-0815', lot: { code: 'BW-2610-027', daysAgo: 21 } },
  { sku: S.tote27A, quantity: 20, reference: 'CBT-552' },
  { sku: S.tote27B, quantity: 12, reference: 'CBT-552' },
  { sku: S.tote10, quantity: 20, reference: 'CBT-552' },
  { sku: S.cartonLarge, quantity: 50, reference: 'TGP-7720' },
  { sku: S.cartonSmall, quantity: 50, reference: 'TGP-7720' },
  { sku: S.kraftPaper, quantity: 1000, reference: 'TGP-7720' },
  { sku: S.hardwareBag, quantity: 500, reference: 'TGP-7720' },
]

const DAY = 24 * 60 * 60 * 1000

/**
 * Receives the demo shop's opening stock into an empty ledger, with one count correction a week
 * later, so the stock page and a part's ledger have something to explain. Does nothing when the
 * ledger already has moves, so running it twice changes nothing; parts missing from the catalog
 * are skipped.
 */
export async function seedDemoStock(db: Db) {
  const [anyMove] = await db.select({ id: stockMoves.id }).from(stockMoves).limit(1)
  if (anyMove) return
  const found = await db.select({ id: parts.id, sku: parts.sku }).from(parts).where(inArray(parts.sku, Object.values(S)))
  const idOf = new Map(found.map((p) => [p.sku, p.id]))
  const [receiver] = await db.select({ id: users.id }).from(users).where(eq(users.role, 'planner')).orderBy(asc(users.createdAt)).limit(1)
  const received = new Date(Date.now() - 21 * DAY)
  const counted = new Date(Date.now() - 14 * DAY)
  const moves: NewStockMoveRow[] = []
  for (const line of OPENING_STOCK) {
    const partId = idOf.get(line.sku)
    if (!partId) continue
    const at = line.lot ? new Date(Date.now() - line.lot.daysAgo * DAY) : received
    let lotId: string | null = null
    if (line.lot) {
      const [lot] = await db.insert(stockLots).values({ partId, code: line.lot.code, firstReceivedAt: at, createdAt: at }).returning({ id: stockLots.id })
      lotId = lot!.id
    }
    moves.push({ partId, kind: 'receive', quantity: line.quantity, stickLength: line.stickLength ?? null, lotId, reference: line.reference, createdBy: receiver?.id ?? null, createdAt: at })
  }
  const collar = idOf.get(S.collar)
  if (collar) {
    moves.push({ partId: collar, kind: 'adjust', quantity: -12, reason: 'Damaged: carton crushed in delivery', createdBy: receiver?.id ?? null, createdAt: counted })
  }
  if (moves.length > 0) await db.insert(stockMoves).values(moves)
}
