import type { Request } from 'express'
import {
  AdjustStockSchema,
  PackingListSchema,
  ReceiveStockSchema,
  ReleaseStockSchema,
  ReserveStockSchema,
  StockListQuerySchema,
  StockMovesQuerySchema,
} from '@kitwright/shared/stock'
import type { Deps } from '../../deps'
import { auditContext, recordAudit } from '../../lib/audit'
import { currentUser } from '../../lib/auth'
import type { RouteTable } from '../../lib/routes'
import {
  adjustStock,
  exportStock,
  listStock,
  listStockPartOptions,
  previewPackingList,
  receivePackingList,
  receiveStock,
  releaseReservationNow,
  reserveStockNow,
  stockLedger,
} from './stock.service'

export function stockRouter(deps: Deps, routes: RouteTable) {
  const r = routes.router('/api/stock')
  // Every bench may look at stock; only the office changes it.
  const office = ['admin', 'planner'] as const
  const audit = (req: Request, action: string, summary: string, data: unknown) =>
    recordAudit(deps.db, auditContext(req), { action, entityType: 'stock', summary, data })
  r.get('/', 'signed-in', async (req, res) => {
    res.json(await listStock(deps.db, StockListQuerySchema.parse(req.query)))
  })
  r.get('/export.csv', 'signed-in', async (req, res) => {
    const csv = await exportStock(deps.db, StockListQuerySchema.parse(req.query))
    const day = new Date().toISOString().slice(0, 10)
    res.type('text/csv; charset=utf-8').attachment(`stock-${day}.csv`).send(csv)
  })
  r.get('/parts', 'signed-in', async (_req, res) => {
    res.json(await listStockPartOptions(deps.db))
  })
  r.get('/moves', 'signed-in', async (req, res) => {
    res.json(await stockLedger(deps.db, StockMovesQuerySchema.parse(req.query)))
  })
  r.post('/receive', office, async (req, res) => {
    const input = ReceiveStockSchema.parse(req.body)
    const result = await receiveStock(deps.db, input, currentUser(req))
    await audit(req, 'stock.receive', `Received ${input.lines.length} line(s) into stock`, input)
    res.status(201).json(result)
  })
  r.post('/receive/preview', office, async (req, res) => {
    const { rowPurchaseOrders: _internal, ...preview } = await previewPackingList(deps.db, PackingListSchema.parse(req.body))
    res.json(preview)
  })
  r.post('/receive/csv', office, async (req, res) => {
    const result = await receivePackingList(deps.db, PackingListSchema.parse(req.body), currentUser(req))
    await audit(req, 'stock.receive', `Received a supplier packing list (${result.moves.length} move(s))`, null)
    res.status(201).json(result)
  })
  r.post('/adjust', office, async (req, res) => {
    const input = AdjustStockSchema.parse(req.body)
    const result = await adjustStock(deps.db, input, currentUser(req))
    await audit(req, 'stock.adjust', `Adjusted stock: ${input.reason}`, input)
    res.status(201).json(result)
  })
  r.post('/reserve', office, async (req, res) => {
    const input = ReserveStockSchema.parse(req.body)
    const result = await reserveStockNow(deps.db, input, currentUser(req))
    await audit(req, 'stock.reserve', `Held ${input.lines.length} line(s) of stock`, input)
    res.status(201).json(result)
  })
  r.post('/release', office, async (req, res) => {
    const input = ReleaseStockSchema.parse(req.body)
    const result = await releaseReservationNow(deps.db, input, currentUser(req))
    await audit(req, 'stock.release', 'Released held stock', input)
    res.status(201).json(result)
  })
  return r
}
