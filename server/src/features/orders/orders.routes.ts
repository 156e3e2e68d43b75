import { CancelOrderSchema, HoldOrderSchema, NewOrderSchema, OrderListQuerySchema, UpdateOrderPlanSchema } from '@kitwright/shared/orders'
import { OrderCsvBodySchema } from '@kitwright/shared/orders-csv'
import { IdParamsSchema } from '@kitwright/shared/users'
import type { Deps } from '../../deps'
import { auditContext, recordAudit } from '../../lib/audit'
import { currentUser } from '../../lib/auth'
import type { RouteTable } from '../../lib/routes'
import { cancelOrderByPlanner, holdOrder, liftOrderHold, updateOrderPlan } from './order-lifecycle.service'
import { importOrders, previewOrdersImport } from './orders-import.service'
import { createPhoneOrder, exportOrdersCsv, getOrder, listOrders } from './orders.service'

export function ordersRouter(deps: Deps, routes: RouteTable) {
  const r = routes.router('/api/orders')
  const planners = ['admin', 'planner'] as const
  r.get('/', planners, async (req, res) => {
    res.json(await listOrders(deps.db, OrderListQuerySchema.parse(req.query)))
  })
  r.get('/export.csv', planners, async (req, res) => {
    const { page: _page, pageSize: _size, ...query } = OrderListQuerySchema.parse(req.query)
    const csv = await exportOrdersCsv(deps.db, query)
    const day = new Date().toISOString().slice(0, 10)
    res.type('text/csv; charset=utf-8').attachment(`orders-${day}.csv`).send(csv)
  })
  r.post('/import/preview', planners, async (req, res) => {
    res.json(await previewOrdersImport(deps.db, OrderCsvBodySchema.parse(req.body).csv))
  })
  r.post('/import', planners, async (req, res) => {
    const result = await importOrders(deps.db, OrderCsvBodySchema.parse(req.body).csv, currentUser(req))
    await recordAudit(deps.db, auditContext(req), { action: 'order.import', entityType: 'order', summary: 'Imported orders from a CSV file' })
    res.json(result)
  })
  r.get('/:id', planners, async (req, res) => {
    const { id } = IdParamsSchema.parse(req.params)
    res.json(await getOrder(deps.db, id))
  })
  r.patch('/:id', planners, async (req, res) => {
    const { id } = IdParamsSchema.parse(req.params)
    res.json(await updateOrderPlan(deps.db, id, UpdateOrderPlanSchema.parse(req.body), currentUser(req), auditContext(req)))
  })
  r.post('/:id/hold', planners, async (req, res) => {
    const { id } = IdParamsSchema.parse(req.params)
    res.json(await holdOrder(deps.db, id, HoldOrderSchema.parse(req.body).reason, currentUser(req), auditContext(req)))
  })
  r.delete('/:id/hold', planners, async (req, res) => {
    const { id } = IdParamsSchema.parse(req.params)
    res.json(await liftOrderHold(deps.db, id, currentUser(req), auditContext(req)))
  })
  r.post('/:id/cancel', planners, async (req, res) => {
    const { id } = IdParamsSchema.parse(req.params)
    res.json(await cancelOrderByPlanner(deps, id, CancelOrderSchema.parse(req.body).reason, currentUser(req), auditContext(req)))
  })
  r.post('/', planners, async (req, res) => {
    const order = await createPhoneOrder(deps.db, NewOrderSchema.parse(req.body), currentUser(req))
    await recordAudit(deps.db, auditContext(req), { action: 'order.create', entityType: 'order', entityId: order.id, summary: `Entered phone order ${order.number}` })
    res.status(201).json(order)
  })
  return r
}
