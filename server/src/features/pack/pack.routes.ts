import { z } from 'zod'
import { ApprovePartialSchema, BuyLabelSchema, PackCodeSchema, PackItemKeySchema, PaperQuerySchema, QuoteRequestSchema, VoidLabelSchema } from '@kitwright/shared/pack'
import type { Deps } from '../../deps'
import { auditContext } from '../../lib/audit'
import { currentUser } from '../../lib/auth'
import type { RouteTable } from '../../lib/routes'
import { packingSlip, shippingLabel } from './documents.service'
import { approvePartial, lookupForPacking, packView, quoteShipment, scanItem, tickItem, undoItem } from './pack.service'
import { CarrierEventRejected } from '../shipping/carrier'
import { applyTrackingEvent, buyLabel, voidLabel } from '../shipping/labels.service'
import { HttpError } from '../../lib/http-errors'
import { shipShipment } from './ship.service'
import { todayUtc } from '../reports/report-sql'
import { packWorklist } from './pack-worklist'

const BENCH = ['admin', 'planner', 'packer'] as const
const OFFICE = ['admin', 'planner'] as const
const OrderParams = z.object({ orderId: z.string().uuid('Not a valid order id') })
const ShipmentParams = z.object({ shipmentId: z.string().uuid('Not a valid shipment id') })

/** The pack bench: scan, confirm, approve a partial shipment, quote, buy the label, ship. */
export function packRouter(deps: Deps, routes: RouteTable) {
  const r = routes.router('/api/pack')
  // Orders with units ready to pack: rush first, then by promised date, then the longest wait.
  r.get('/worklist', BENCH, async (_req, res) => {
    res.json(await packWorklist(deps.db, todayUtc()))
  })
  r.get('/lookup', BENCH, async (req, res) => {
    res.json(await lookupForPacking(deps, PackCodeSchema.parse(req.query).code))
  })
  r.get('/orders/:orderId', BENCH, async (req, res) => {
    res.json(await packView(deps, OrderParams.parse(req.params).orderId))
  })
  r.post('/orders/:orderId/scan', BENCH, async (req, res) => {
    res.json(await scanItem(deps, OrderParams.parse(req.params).orderId, PackCodeSchema.parse(req.body).code, currentUser(req)))
  })
  r.post('/orders/:orderId/tick', BENCH, async (req, res) => {
    res.json(await tickItem(deps, OrderParams.parse(req.params).orderId, PackItemKeySchema.parse(req.body).itemKey, currentUser(req)))
  })
  r.post('/orders/:orderId/undo', BENCH, async (req, res) => {
    res.json(await undoItem(deps, OrderParams.parse(req.params).orderId, PackItemKeySchema.parse(req.body).itemKey, currentUser(req)))
  })
  // Only a planner (or the owner) may let an order go short.
  r.post('/orders/:orderId/approve-partial', OFFICE, async (req, res) => {
    const { orderId } = OrderParams.parse(req.params)
    res.json(await approvePartial(deps, orderId, ApprovePartialSchema.parse(req.body), currentUser(req), auditContext(req)))
  })
  r.post('/orders/:orderId/quote', BENCH, async (req, res) => {
    res.json(await quoteShipment(deps, OrderParams.parse(req.params).orderId, QuoteRequestSchema.parse(req.body)))
  })
  // Exactly once: a second tap, a retry or a crash half-way ends with the one label (see labels.service).
  r.post('/orders/:orderId/label', BENCH, async (req, res) => {
    res.status(201).json(await buyLabel(deps, OrderParams.parse(req.params).orderId, BuyLabelSchema.parse(req.body), currentUser(req)))
  })
  r.post('/orders/:orderId/ship', BENCH, async (req, res) => {
    res.json(await shipShipment(deps, OrderParams.parse(req.params).orderId, currentUser(req), auditContext(req)))
  })
  return r
}

/** A shipment's printed papers: the packing slip (Letter or A4) and the 4 × 6 in label. */
export function shipmentsRouter(deps: Deps, routes: RouteTable) {
  const r = routes.router('/api/shipments')
  r.get('/:shipmentId/packing-slip.pdf', BENCH, async (req, res) => {
    const { shipmentId } = ShipmentParams.parse(req.params)
    const { paper } = PaperQuerySchema.parse(req.query)
    res.type('application/pdf').set('content-disposition', `inline; filename="packing-slip-${paper}.pdf"`).send(await packingSlip(deps.db, shipmentId, paper))
  })
  // Before shipping a bench voids its own label; after shipping only the office (checked in the service).
  r.post('/:shipmentId/void-label', BENCH, async (req, res) => {
    const { shipmentId } = ShipmentParams.parse(req.params)
    res.json(await voidLabel(deps, shipmentId, VoidLabelSchema.parse(req.body), currentUser(req), auditContext(req)))
  })
  // The carrier's signed tracking events. Public: the signature, not a session, says who is calling.
  r.post('/tracking-events', 'public', async (req, res) => {
    if (!deps.carrier) throw new HttpError(404, 'not_found', 'No carrier is set up on this server')
    let event
    try {
      event = deps.carrier.readEvent(req.rawBody ?? Buffer.alloc(0), req.headers)
    } catch (err) {
      if (!(err instanceof CarrierEventRejected)) throw err
      req.log.warn({ reason: err.message }, 'carrier tracking event rejected')
      throw new HttpError(401, 'unauthenticated', `Event refused: ${err.message}`)
    }
    if (!event) return void res.json({ received: true, ignored: true })
    const { duplicate } = await applyTrackingEvent(deps, event)
    res.json({ received: true, duplicate })
  })
  r.get('/:shipmentId/label.pdf', BENCH, async (req, res) => {
    const { shipmentId } = ShipmentParams.parse(req.params)
    res.type('application/pdf').set('content-disposition', 'inline; filename="shipping-label.pdf"').send(await shippingLabel(deps.db, shipmentId))
  })
  return r
}
