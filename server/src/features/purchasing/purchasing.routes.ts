import { z } from 'zod'
import { PurchaseOrderListQuerySchema, SaveSupplierPartSchema, SaveSupplierSchema, UpdatePurchaseOrderSchema } from '@kitwright/shared/purchasing'
import type { Deps } from '../../deps'
import { auditContext, recordAudit } from '../../lib/audit'
import { currentUser } from '../../lib/auth'
import type { RouteTable } from '../../lib/routes'
import { sendPdfInline } from '../labels/pdf-document'
import { cancelPurchaseOrder, draftFromShortages, getPurchaseOrder, listPurchaseOrders, purchaseOrderPdfOf, sendPurchaseOrder, updateDraft } from './purchase-orders.service'
import { createSupplier, getSupplier, listSuppliers, removeSupplierPart, saveSupplierPart, updateSupplier } from './suppliers.service'

const IdParams = z.object({ id: z.string().uuid('Not a valid id') })
const SupplierPartParams = z.object({ id: z.string().uuid('Not a valid id'), partId: z.string().uuid('Not a valid id') })
const PaperQuery = z.object({ paper: z.enum(['letter', 'a4'], { error: 'Use letter or a4' }).default('letter') }).strict()

/** Only the office buys: admin and planner. */
const OFFICE = ['admin', 'planner'] as const

export function suppliersRouter(deps: Deps, routes: RouteTable) {
  const r = routes.router('/api/suppliers')
  r.get('/', OFFICE, async (_req, res) => {
    res.json(await listSuppliers(deps.db))
  })
  r.post('/', OFFICE, async (req, res) => {
    const supplier = await createSupplier(deps.db, SaveSupplierSchema.parse(req.body))
    await recordAudit(deps.db, auditContext(req), { action: 'supplier.create', entityType: 'supplier', entityId: supplier.id, summary: `Added supplier ${supplier.name}`, data: null })
    res.status(201).json(supplier)
  })
  r.get('/:id', OFFICE, async (req, res) => {
    res.json(await getSupplier(deps.db, IdParams.parse(req.params).id))
  })
  r.put('/:id', OFFICE, async (req, res) => {
    const supplier = await updateSupplier(deps.db, IdParams.parse(req.params).id, SaveSupplierSchema.parse(req.body))
    await recordAudit(deps.db, auditContext(req), { action: 'supplier.update', entityType: 'supplier', entityId: supplier.id, summary: `Changed supplier ${supplier.name}`, data: null })
    res.json(supplier)
  })
  r.put('/:id/parts/:partId', OFFICE, async (req, res) => {
    const { id, partId } = SupplierPartParams.parse(req.params)
    const supplier = await saveSupplierPart(deps.db, id, partId, SaveSupplierPartSchema.parse(req.body))
    await recordAudit(deps.db, auditContext(req), { action: 'supplier.part', entityType: 'supplier', entityId: id, summary: `Set what ${supplier.name} sells of a part`, data: { partId } })
    res.json(supplier)
  })
  r.delete('/:id/parts/:partId', OFFICE, async (req, res) => {
    const { id, partId } = SupplierPartParams.parse(req.params)
    res.json(await removeSupplierPart(deps.db, id, partId))
  })
  return r
}

export function purchaseOrdersRouter(deps: Deps, routes: RouteTable) {
  const r = routes.router('/api/purchase-orders')
  r.get('/', OFFICE, async (req, res) => {
    res.json(await listPurchaseOrders(deps.db, PurchaseOrderListQuerySchema.parse(req.query)))
  })
  r.post('/from-shortages', OFFICE, async (req, res) => {
    const result = await draftFromShortages(deps.db, currentUser(req))
    await recordAudit(deps.db, auditContext(req), {
      action: 'purchase_order.draft',
      entityType: 'purchase_order',
      summary: `Drafted ${result.created.length} purchase order(s) from shortages${result.created.length ? `: ${result.created.map((p) => p.number).join(', ')}` : ''}`,
      data: { skipped: result.skipped },
    })
    res.status(201).json(result)
  })
  r.get('/:id', OFFICE, async (req, res) => {
    res.json(await getPurchaseOrder(deps.db, IdParams.parse(req.params).id))
  })
  r.put('/:id', OFFICE, async (req, res) => {
    res.json(await updateDraft(deps.db, IdParams.parse(req.params).id, UpdatePurchaseOrderSchema.parse(req.body)))
  })
  r.get('/:id/pdf', OFFICE, async (req, res) => {
    const { number, pdf } = await purchaseOrderPdfOf(deps.db, IdParams.parse(req.params).id, PaperQuery.parse(req.query).paper)
    sendPdfInline(res, `${number}.pdf`, pdf)
  })
  r.post('/:id/send', OFFICE, async (req, res) => {
    const { purchaseOrder, alreadySent } = await sendPurchaseOrder(deps, IdParams.parse(req.params).id)
    if (!alreadySent) {
      await recordAudit(
        deps.db,
        auditContext(req),
        { action: 'purchase_order.send', entityType: 'purchase_order', entityId: purchaseOrder.id, summary: `Sent ${purchaseOrder.number} to ${purchaseOrder.supplier.name}`, data: null },
      )
    }
    res.status(alreadySent ? 200 : 201).json(purchaseOrder)
  })
  r.post('/:id/cancel', OFFICE, async (req, res) => {
    const po = await cancelPurchaseOrder(deps.db, IdParams.parse(req.params).id)
    await recordAudit(deps.db, auditContext(req), { action: 'purchase_order.cancel', entityType: 'purchase_order', entityId: po.id, summary: `Cancelled ${po.number}`, data: null })
    res.json(po)
  })
  return r
}
