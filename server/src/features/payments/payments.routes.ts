import { RecordPaymentSchema } from '@kitwright/shared/payments'
import { IdParamsSchema } from '@kitwright/shared/users'
import { z } from 'zod'
import type { Deps } from '../../deps'
import { auditContext } from '../../lib/audit'
import { currentUser } from '../../lib/auth'
import { HttpError } from '../../lib/http-errors'
import type { RouteTable } from '../../lib/routes'
import { PaymentSignatureError } from './payment-service'
import { applyPaymentEvent, getOrderPayments, recordPayment, resolvePayLink, sendPaymentLink } from './payments.service'

/** An order's payments: recorded by a planner, or through a payment link the customer pays. */
export function orderPaymentsRouter(deps: Deps, routes: RouteTable) {
  const r = routes.router('/api/orders')
  const planners = ['admin', 'planner'] as const
  r.get('/:id/payments', planners, async (req, res) => {
    const { id } = IdParamsSchema.parse(req.params)
    res.json(await getOrderPayments(deps.db, id, !!deps.payments))
  })
  r.post('/:id/payments', planners, async (req, res) => {
    const { id } = IdParamsSchema.parse(req.params)
    await recordPayment(deps.db, id, RecordPaymentSchema.parse(req.body), currentUser(req), auditContext(req))
    res.status(201).json(await getOrderPayments(deps.db, id, !!deps.payments))
  })
  r.post('/:id/payment-links', planners, async (req, res) => {
    const { id } = IdParamsSchema.parse(req.params)
    await sendPaymentLink(deps, id, currentUser(req), auditContext(req))
    res.status(201).json(await getOrderPayments(deps.db, id, !!deps.payments))
  })
  return r
}

const PayTokenSchema = z.object({ token: z.string().min(10, 'This payment link is cut short; copy the whole link from the e-mail').max(2000) })

/** What the customer and the payment service reach: public, the token or the signature says who is calling. */
export function paymentsPublicRouter(deps: Deps, routes: RouteTable) {
  const r = routes.router('/api')
  r.get('/pay/thanks', 'public', (_req, res) => {
    res.type('html').send(page('Thank you', 'Your payment is on its way to the shop. You will get an e-mail when your order ships.'))
  })
  r.get('/pay/:token', 'public', async (req, res) => {
    const { token } = PayTokenSchema.parse(req.params)
    const where = await resolvePayLink(deps.db, deps.tokens, token)
    if ('redirect' in where) res.redirect(303, where.redirect)
    else res.type('html').send(page('Nothing to pay', where.message))
  })
  r.post('/webhooks/payments', 'public', async (req, res) => {
    if (!deps.payments) throw new HttpError(404, 'not_found', 'No payment service is set up')
    let event
    try {
      event = deps.payments.readEvent(req.rawBody ?? Buffer.alloc(0), req.get('stripe-signature'))
    } catch (err) {
      if (!(err instanceof PaymentSignatureError)) throw err
      req.log.warn({ reason: err.message }, 'payment event refused')
      throw new HttpError(401, 'unauthenticated', `Payment event refused: ${err.message}`)
    }
    res.json({ received: true, ...(await applyPaymentEvent(deps.db, event, req.body)) })
  })
  return r
}

function page(title: string, message: string) {
  const esc = (s: string) => s.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`)
  return `<!doctype html><html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1"><title>${esc(title)}</title></head><body style="font-family: sans-serif; max-width: 36rem; margin: 3rem auto; padding: 0 1rem"><h1>${esc(title)}</h1><p>${esc(message)}</p></body></html>`
}
