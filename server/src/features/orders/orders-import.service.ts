import type { OrderCsvError, OrderImportPreview, OrderImportResult } from '@kitwright/shared/orders-csv'
import type { NewOrder } from '@kitwright/shared/orders'
import type { Db, Tx } from '../../db/client'
import { BadRequest } from '../../lib/http-errors'
import { readOrdersCsv } from './orders.csv'
import { selectKitsForLines, selectOrderNumbers } from './orders.queries'
import { createOrder, type OrderActor } from './orders.service'

interface ImportPlan {
  preview: OrderImportPreview
  creates: NewOrder[]
}

/**
 * Reads an orders file and works out what importing it would do: orders whose number is already
 * stored are skipped (importing the same file twice creates nothing the second time); a kit SKU that
 * matches no kit is an error; a store product that maps to no kit is a warning (kept and flagged).
 */
async function planImport(db: Db | Tx, csv: string): Promise<ImportPlan> {
  const { orders, errors } = readOrdersCsv(csv)
  const warnings: OrderCsvError[] = []
  const lines = orders.flatMap((o) => (o.input ? o.input.lines.map((l, i) => ({ row: o.rows[i]!, line: l })) : []))
  const kits = await selectKitsForLines(
    db,
    lines.flatMap((l) => (l.line.kitSku ? [l.line.kitSku] : [])),
    lines.flatMap((l) => (l.line.storeProductId ? [l.line.storeProductId] : [])),
  )
  const skus = new Set(kits.map((k) => k.sku.toLowerCase()))
  const products = new Set(kits.flatMap((k) => (k.storeProductId ? [k.storeProductId] : [])))
  const badOrders = new Set<string>()
  for (const o of orders) {
    o.input?.lines.forEach((line, i) => {
      const row = o.rows[i]!
      if (line.kitSku && !skus.has(line.kitSku.toLowerCase())) {
        errors.push({ row, column: 'kit_sku', message: `No kit has the SKU ${line.kitSku}; check the SKU on the kits page` })
        badOrders.add(o.number)
      } else if (!line.kitSku && line.storeProductId && !products.has(line.storeProductId)) {
        warnings.push({ row, column: 'store_product_id', message: `Store product ${line.storeProductId} maps to no kit; the line is kept and flagged for the planner` })
      }
    })
  }
  errors.sort((a, b) => a.row - b.row)
  const existing = await selectOrderNumbers(db, orders.map((o) => o.number))
  const preview: OrderImportPreview = { orders: [], errors, warnings, creates: 0, skips: 0 }
  const creates: NewOrder[] = []
  for (const o of orders) {
    const ok = o.input !== null && !badOrders.has(o.number)
    const action = !ok ? null : existing.has(o.number) ? 'skip' : 'create'
    const input = o.input
    preview.orders.push({
      number: o.number,
      rows: o.rows,
      customerName: o.customerName,
      lineCount: o.rows.length,
      units: input ? input.lines.reduce((s, l) => s + l.quantity, 0) : 0,
      totalCents: input ? input.lines.reduce((s, l) => s + l.quantity * l.unitPriceCents, 0) : 0,
      action,
    })
    if (action === 'create') {
      preview.creates += 1
      creates.push(input!)
    } else if (action === 'skip') preview.skips += 1
  }
  return { preview, creates }
}

export async function previewOrdersImport(db: Db, csv: string): Promise<OrderImportPreview> {
  return (await planImport(db, csv)).preview
}

/** Imports every new order of the file in one transaction, or nothing when any row has an error. */
export async function importOrders(db: Db, csv: string, actor: NonNullable<OrderActor>): Promise<OrderImportResult> {
  return db.transaction(async (tx) => {
    const { preview, creates } = await planImport(tx, csv)
    if (preview.errors.length > 0) {
      const first = preview.errors[0]!
      const fields: Record<string, string> = {}
      for (const e of preview.errors) fields[`rows.${e.row}.${e.column ?? '_'}`] ??= e.message
      const more = preview.errors.length > 1 ? ` (and ${preview.errors.length - 1} more)` : ''
      throw new BadRequest(`Nothing was imported: row ${first.row}: ${first.message}${more}`, fields)
    }
    const result: OrderImportResult = { created: [], skipped: preview.orders.filter((o) => o.action === 'skip').map((o) => o.number) }
    for (const input of creates) {
      const { created } = await createOrder(tx, input, 'csv', actor)
      // Stored by someone else since the plan was made: skipped like any other known number.
      ;(created ? result.created : result.skipped).push(input.number)
    }
    return result
  })
}
