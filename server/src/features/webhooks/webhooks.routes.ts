import { StoreEventSchema, type StoreWebhookReply } from '@kitwright/shared/store-events'
import type { Deps } from '../../deps'
import { HttpError } from '../../lib/http-errors'
import type { RouteTable } from '../../lib/routes'
import { receiveStoreEvent } from './store-events.service'
import { checkStoreSignature, STORE_SIGNATURE_HEADER, STORE_TIMESTAMP_HEADER } from './store-signature'

/** The web store's deliveries. Public: the signature, not a session, says who is calling. */
export function webhooksRouter(deps: Deps, routes: RouteTable) {
  const r = routes.router('/api/webhooks')

  r.post('/store', 'public', async (req, res) => {
    const check = checkStoreSignature({
      secret: deps.storeWebhookSecret,
      timestamp: req.get(STORE_TIMESTAMP_HEADER),
      signature: req.get(STORE_SIGNATURE_HEADER),
      rawBody: req.rawBody,
      nowSeconds: Math.floor(Date.now() / 1000),
    })
    if (!check.ok) {
      req.log.warn({ reason: check.reason }, 'store webhook delivery rejected')
      throw new HttpError(401, 'unauthenticated', `Delivery refused: ${check.reason}`)
    }
    const event = StoreEventSchema.parse(req.body)
    const { duplicate } = await receiveStoreEvent(deps, event, req.body)
    const reply: StoreWebhookReply = { received: true, duplicate }
    res.json(reply)
  })

  return r
}
