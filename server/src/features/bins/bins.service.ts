import { and, asc, eq, inArray, sql } from 'drizzle-orm'
import { binCode, type Bin, type CreateBins } from '@kitwright/shared/bins'
import type { Db, Tx } from '../../db/client'
import { bins, workOrders, type BinRow } from '../../db/schema/index'
import { Conflict, NotFound } from '../../lib/http-errors'

function toBin(row: BinRow, serial: string | null): Bin {
  return {
    id: row.id,
    code: row.code,
    status: row.status,
    workOrder: row.workOrderId && serial ? { id: row.workOrderId, serial } : null,
    assignedAt: row.assignedAt?.toISOString() ?? null,
  }
}

/** The number of a BIN-nnnn code, to compare codes of different widths (BIN-9999 < BIN-10000). */
const binNumber = sql`substring(${bins.code} from '^BIN-([0-9]+)$')::int`

/** The bins of one batch, by the codes of its first and last bin (both included), in code order. */
export async function listBinRange(db: Db | Tx, from: string | undefined, to: string | undefined): Promise<Bin[]> {
  const n = (code: string) => Number(/^BIN-(\d+)$/.exec(code)![1])
  const rows = await db
    .select({ bin: bins, serial: workOrders.serial })
    .from(bins)
    .leftJoin(workOrders, eq(workOrders.id, bins.workOrderId))
    .where(and(sql`${bins.code} ~ '^BIN-[0-9]+$'`, from ? sql`${binNumber} >= ${n(from)}` : undefined, to ? sql`${binNumber} <= ${n(to)}` : undefined))
    .orderBy(asc(binNumber))
  return rows.map((r) => toBin(r.bin, r.serial))
}

export async function listBins(db: Db | Tx, ids?: readonly string[]): Promise<Bin[]> {
  const rows = await db
    .select({ bin: bins, serial: workOrders.serial })
    .from(bins)
    .leftJoin(workOrders, eq(workOrders.id, bins.workOrderId))
    .where(ids ? inArray(bins.id, ids.length ? [...ids] : ['00000000-0000-0000-0000-000000000000']) : undefined)
    .orderBy(asc(bins.code))
  return rows.map((r) => toBin(r.bin, r.serial))
}

/** Adds a batch of bins numbered on from the highest BIN-nnnn code. */
export async function createBins(db: Db, input: CreateBins): Promise<Bin[]> {
  return db.transaction(async (tx) => {
    // One batch at a time, so two batches never take the same numbers.
    await tx.execute(sql`lock table bins in share row exclusive mode`)
    const [row] = await tx.execute<{ n: number }>(sql`select coalesce(max(substring(code from '^BIN-([0-9]+)$')::int), 0)::int as n from bins`).then((r) => r.rows)
    const start = (row?.n ?? 0) + 1
    const values = Array.from({ length: input.count }, (_, i) => ({ code: binCode(start + i) }))
    const inserted = await tx.insert(bins).values(values).returning()
    return inserted.map((b) => toBin(b, null))
  })
}

/** Normalises a scanned or typed bin code (scanners may add spaces; people type lower case). */
export function normaliseBinCode(code: string) {
  return code.trim().toUpperCase()
}

/**
 * Puts a bin to work for one work order, inside the caller's transaction. Scanning the bin a work
 * order already has is a no-op; a bin holding another unit, or a second bin for the same unit, is
 * refused with what to do instead.
 */
export async function assignBin(tx: Tx, code: string, workOrder: { id: string; serial: string }): Promise<BinRow> {
  const wanted = normaliseBinCode(code)
  const [bin] = await tx.select().from(bins).where(eq(bins.code, wanted)).for('update')
  if (!bin) throw new NotFound(`No bin ${wanted}: check the label, or add the bin on the bins page`)
  if (bin.workOrderId === workOrder.id) return bin
  if (bin.status === 'in_use') {
    const [other] = bin.workOrderId ? await tx.select({ serial: workOrders.serial }).from(workOrders).where(eq(workOrders.id, bin.workOrderId)) : []
    throw new Conflict(`Bin ${bin.code} already holds work order ${other?.serial ?? '(unknown)'}; scan a free bin`)
  }
  const [current] = await tx.select().from(bins).where(eq(bins.workOrderId, workOrder.id))
  if (current) throw new Conflict(`Work order ${workOrder.serial} already has bin ${current.code}; put its pieces there`)
  const [updated] = await tx
    .update(bins)
    .set({ status: 'in_use', workOrderId: workOrder.id, assignedAt: new Date() })
    .where(and(eq(bins.id, bin.id), eq(bins.status, 'free')))
    .returning()
  return updated!
}

/** Frees a bin after packing: it goes back on the rack for the next unit. For the pack bench. */
export async function freeBin(tx: Tx, binId: string): Promise<void> {
  const [row] = await tx.update(bins).set({ status: 'free', workOrderId: null, assignedAt: null }).where(eq(bins.id, binId)).returning({ id: bins.id })
  if (!row) throw new NotFound('No such bin')
}
