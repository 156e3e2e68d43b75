import { createHmac, timingSafeEqual } from 'node:crypto'
import { STORE_WEBHOOK_TOLERANCE_SECONDS } from '@kitwright/shared/store-events'

/** Unix time in whole seconds when the store sent the delivery. */
export const STORE_TIMESTAMP_HEADER = 'x-store-timestamp'
/** `sha256=` and the lower-case hex HMAC-SHA256 of `<timestamp>.<raw body>` under the shared secret. */
export const STORE_SIGNATURE_HEADER = 'x-store-signature'

/**
 * Signs one delivery the way the store does: HMAC-SHA256 over the timestamp, a dot and the body's
 * exact bytes. Signing the timestamp with the body means an old delivery cannot be replayed with a
 * fresh timestamp.
 */
export function signStoreDelivery(secret: string, timestamp: number, rawBody: string | Buffer): string {
  const mac = createHmac('sha256', secret)
  mac.update(`${timestamp}.`)
  mac.update(rawBody)
  return `sha256=${mac.digest('hex')}`
}

export type SignatureCheck = { ok: true } | { ok: false; reason: string }

/** Checks a delivery's timestamp (within the tolerance of `nowSeconds`, either way) and its signature, in constant time. */
export function checkStoreSignature(input: {
  secret: string | undefined
  timestamp: string | undefined
  signature: string | undefined
  rawBody: Buffer | undefined
  nowSeconds: number
}): SignatureCheck {
  if (!input.secret) return { ok: false, reason: 'STORE_WEBHOOK_SECRET is not set on this server' }
  if (!input.timestamp) return { ok: false, reason: 'no X-Store-Timestamp header' }
  if (!/^\d{1,12}$/.test(input.timestamp)) return { ok: false, reason: 'X-Store-Timestamp is not unix seconds' }
  const skew = input.nowSeconds - Number(input.timestamp)
  if (Math.abs(skew) > STORE_WEBHOOK_TOLERANCE_SECONDS) {
    return { ok: false, reason: `timestamp is ${Math.abs(skew)} s ${skew > 0 ? 'old' : 'in the future'} (limit ${STORE_WEBHOOK_TOLERANCE_SECONDS} s)` }
  }
  if (!input.signature) return { ok: false, reason: 'no X-Store-Signature header' }
  const match = /^sha256=([0-9a-f]{64})$/.exec(input.signature.trim().toLowerCase())
  if (!match) return { ok: false, reason: 'X-Store-Signature is not sha256=<64 hex digits>' }
  if (!input.rawBody) return { ok: false, reason: 'no JSON body to check the signature against' }
  const expected = Buffer.from(signStoreDelivery(input.secret, Number(input.timestamp), input.rawBody).slice('sha256='.length), 'hex')
  const given = Buffer.from(match[1]!, 'hex')
  if (!timingSafeEqual(expected, given)) return { ok: false, reason: 'signature does not match the body' }
  return { ok: true }
}
