import { z } from 'zod'
import { BagLabelQuerySchema, RecordUnitWeightSchema, WeighBagSchema } from '@kitwright/shared/bag-weights'
import type { Deps } from '../../deps'
import { auditContext } from '../../lib/audit'
import { currentUser } from '../../lib/auth'
import type { RouteTable } from '../../lib/routes'
import { bagLabelPdf } from '../labels/bag-label.pdf'
import { sendPdfInline } from '../labels/pdf-document'
import { bagChecks, bagLabelFacts, listUnitWeights, recordUnitWeight, unitWeightHistory, weighBag } from './bag-weights.service'

const OFFICE = ['admin', 'planner'] as const
const BENCH = ['admin', 'planner', 'packer'] as const
const PartParams = z.object({ partId: z.string().uuid('Not a valid part id') })
const OrderParams = z.object({ orderId: z.string().uuid('Not a valid order id') })

/** Unit weights of small parts: the packer reads them, the planner (or the owner) weighs samples. */
export function unitWeightsRouter(deps: Deps, routes: RouteTable) {
  const r = routes.router('/api/unit-weights')
  r.get('/', BENCH, async (_req, res) => {
    res.json(await listUnitWeights(deps.db))
  })
  r.get('/:partId', OFFICE, async (req, res) => {
    res.json(await unitWeightHistory(deps.db, PartParams.parse(req.params).partId))
  })
  r.post('/:partId', OFFICE, async (req, res) => {
    const { partId } = PartParams.parse(req.params)
    const input = RecordUnitWeightSchema.parse(req.body)
    res.status(201).json(await recordUnitWeight(deps.db, partId, input, currentUser(req), auditContext(req)))
  })
  return r
}

/** Hardware bags at the pack bench: what each should weigh, weigh it, print its label. */
export function bagsRouter(deps: Deps, routes: RouteTable) {
  const r = routes.router('/api/bags')
  r.get('/orders/:orderId', BENCH, async (req, res) => {
    res.json(await bagChecks(deps.db, OrderParams.parse(req.params).orderId))
  })
  // A refused bag is recorded too (201 with `accepted: false`); bad input and unweighable bags record nothing.
  r.post('/orders/:orderId/weigh', BENCH, async (req, res) => {
    const { orderId } = OrderParams.parse(req.params)
    res.status(201).json(await weighBag(deps, orderId, WeighBagSchema.parse(req.body), currentUser(req)))
  })
  r.get('/orders/:orderId/label.pdf', BENCH, async (req, res) => {
    const { orderId } = OrderParams.parse(req.params)
    const { itemKey } = BagLabelQuerySchema.parse(req.query)
    const facts = await bagLabelFacts(deps.db, orderId, itemKey)
    sendPdfInline(res, `bag-${facts.serial}.pdf`, await bagLabelPdf(facts))
  })
  return r
}
