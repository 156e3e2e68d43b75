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
    res.status(201).json(await receiveStock(deps.db, ReceiveStockSchema.parse(req.body), currentUser(req)))
  })
  r.post('/receive/preview', office, async (req, res) => {
    res.json(await previewPackingList(deps.db, PackingListSchema.parse(req.body)))
  })
  r.post('/receive/csv', office, async (req, res) => {
    res.status(201).json(await receivePackingList(deps.db, PackingListSchema.parse(req.body), currentUser(req)))
  })
  r.post('/adjust', office, async (req, res) => {
    res.status(201).json(await adjustStock(deps.db, AdjustStockSchema.parse(req.body), currentUser(req)))
  })
  r.post('/reserve', office, async (req, res) => {
    res.status(201).json(await reserveStockNow(deps.db, ReserveStockSchema.parse(req.body), currentUser(req)))
  })
  r.post('/release', office, async (req, res) => {
    res.status(201).json(await releaseReservationNow(deps.db, ReleaseStockSchema.parse(req.body), currentUser(req)))
  })
  return r
}
