import { ConfirmPhotoSchema, SerialParamsSchema } from '@kitwright/shared/build'
import {
  BuyReturnLabelSchema,
  DecideReturnSchema,
  DisposeReturnSchema,
  OpenReturnSchema,
  PresignReturnPhotoSchema,
  ReceiveReturnSchema,
  ReturnListQuerySchema,
  ReturnLookupQuerySchema,
  ReturnParamsSchema,
  UpdateReturnReasonsSchema,
} from '@kitwright/shared/returns'
import { RETURN_DECISION_LABELS, RETURN_DISPOSITION_LABELS } from '@kitwright/shared/status-words'
import type { Request } from 'express'
import type { Deps } from '../../deps'
import { auditContext, recordAudit } from '../../lib/audit'
import { currentUser } from '../../lib/auth'
import type { RouteTable } from '../../lib/routes'
import { sendPdfInline } from '../labels/pdf-document'
import { returnLabelPdf } from './return-label.pdf'
import { confirmReturnPhoto, presignReturnPhoto } from './return-photos.service'
import { listReturns, loadReturn, returnsOfSerial, returnSummary } from './returns.queries'
import { buyReturnLabel, decideReturn, disposeReturnedUnit, listReturnReasons, lookupReturnable, openReturn, receiveReturn, setReturnReasons } from './returns.service'

/** The office opens, labels and decides returns; the owner does all of it too. */
const OFFICE = ['admin', 'planner'] as const
/** Who reads returns: the office and the pack bench that receives them. */
const READERS = ['admin', 'planner', 'packer'] as const
/** The pack bench receives the parcel; the office covers the bench when the packer is out, as at the pack bench. */
const RECEIVERS = ['admin', 'planner', 'packer'] as const
/** Who reads a unit's build record, and so its returns. */
const RECORD_READERS = ['admin', 'planner', 'assembler', 'packer'] as const

/** Returns by serial: open, label, receive, photograph, decide; the shop's reasons; the owner's summary. */
export function returnsRouter(deps: Deps, routes: RouteTable) {
  const r = routes.router('/api/returns')
  const audit = (req: Request, action: string, returnId: string, summary: string) =>
    recordAudit(deps.db, auditContext(req), { action, entityType: 'return', entityId: returnId, summary })

  r.get('/reasons', READERS, async (_req, res) => {
    res.json(await listReturnReasons(deps.db))
  })
  r.put('/reasons', ['admin'], async (req, res) => {
    const saved = await setReturnReasons(deps.db, UpdateReturnReasonsSchema.parse(req.body))
    await recordAudit(deps.db, auditContext(req), {
      action: 'returns.reasons',
      entityType: 'settings',
      summary: `Return reasons set: ${saved.reasons.join(', ')}`,
    })
    res.json(saved)
  })
  r.get('/summary', OFFICE, async (_req, res) => {
    res.json(await returnSummary(deps.db))
  })
  r.get('/lookup', OFFICE, async (req, res) => {
    const { code } = ReturnLookupQuerySchema.parse(req.query)
    res.json(await lookupReturnable(deps.db, code))
  })
  // The returns of one unit, for its build record (original build, return, repair, retest).
  r.get('/units/:serial', RECORD_READERS, async (req, res) => {
    const { serial } = SerialParamsSchema.parse(req.params)
    res.json({ returns: await returnsOfSerial(deps.db, serial) })
  })
  r.get('/', READERS, async (req, res) => {
    const { status } = ReturnListQuerySchema.parse(req.query)
    res.json({ returns: await listReturns(deps.db, status) })
  })
  r.post('/', OFFICE, async (req, res) => {
    const created = await openReturn(deps.db, OpenReturnSchema.parse(req.body), currentUser(req))
    await audit(req, 'return.open', created.id, `Opened return ${created.number}: ${created.reason}`)
    res.status(201).json(await loadReturn(deps.db, deps.storage, created.id))
  })
  r.post('/receive', RECEIVERS, async (req, res) => {
    const { code } = ReceiveReturnSchema.parse(req.body)
    const received = await receiveReturn(deps.db, code, currentUser(req))
    await audit(req, 'return.receive', received.id, `Received return ${received.number} (scanned ${code})`)
    res.json(await loadReturn(deps.db, deps.storage, received.id))
  })
  r.get('/:returnId', READERS, async (req, res) => {
    const { returnId } = ReturnParamsSchema.parse(req.params)
    res.json(await loadReturn(deps.db, deps.storage, returnId))
  })
  r.post('/:returnId/label', OFFICE, async (req, res) => {
    const { returnId } = ReturnParamsSchema.parse(req.params)
    await buyReturnLabel(deps, returnId, BuyReturnLabelSchema.parse(req.body), currentUser(req))
    const view = await loadReturn(deps.db, deps.storage, returnId)
    res.status(201).json(view)
  })
  r.get('/:returnId/label.pdf', READERS, async (req, res) => {
    const { returnId } = ReturnParamsSchema.parse(req.params)
    const { filename, pdf } = await returnLabelPdf(deps.db, returnId)
    sendPdfInline(res, filename, pdf)
  })
  r.post('/:returnId/photos/presign', READERS, async (req, res) => {
    const { returnId } = ReturnParamsSchema.parse(req.params)
    res.status(201).json(await presignReturnPhoto(deps.db, deps.storage, returnId, PresignReturnPhotoSchema.parse(req.body), currentUser(req)))
  })
  r.post('/:returnId/photos/confirm', READERS, async (req, res) => {
    const { returnId } = ReturnParamsSchema.parse(req.params)
    const { key } = ConfirmPhotoSchema.parse(req.body)
    await confirmReturnPhoto(deps.db, deps.storage, returnId, key, currentUser(req))
    res.json(await loadReturn(deps.db, deps.storage, returnId))
  })
  r.post('/:returnId/decision', OFFICE, async (req, res) => {
    const { returnId } = ReturnParamsSchema.parse(req.params)
    const input = DecideReturnSchema.parse(req.body)
    const decided = await decideReturn(deps.db, returnId, input, currentUser(req))
    await audit(
      req,
      'return.decide',
      decided.id,
      `Return ${decided.number}: ${RETURN_DECISION_LABELS[input.decision]}${decided.refundCents !== null ? ` (${(decided.refundCents / 100).toFixed(2)})` : ''}`,
    )
    res.json(await loadReturn(deps.db, deps.storage, returnId))
  })
  // What becomes of a replaced or refunded unit: the office's, as the decision is; recorded once.
  r.post('/:returnId/disposition', OFFICE, async (req, res) => {
    const { returnId } = ReturnParamsSchema.parse(req.params)
    const input = DisposeReturnSchema.parse(req.body)
    const { ret, recorded } = await disposeReturnedUnit(deps.db, returnId, input, currentUser(req))
    if (recorded)
      await audit(req, 'return.dispose', ret.id, `Return ${ret.number}: unit ${RETURN_DISPOSITION_LABELS[input.disposition].toLowerCase()}${input.note ? ` (${input.note})` : ''}`)
    res.json(await loadReturn(deps.db, deps.storage, returnId))
  })
  return r
}
