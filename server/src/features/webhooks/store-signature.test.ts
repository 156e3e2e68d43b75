import { createHash } from 'node:crypto'
import { describe, expect, it } from 'vitest'
import { checkStoreSignature, signStoreDelivery } from './store-signature'

/** HMAC built by hand from its definition (RFC 2104, section 2) over SHA-256, block size 64 bytes. */
function hmacSha256ByDefinition(key: Buffer, message: Buffer): string {
  const k = Buffer.alloc(64)
  ;(key.length > 64 ? createHash('sha256').update(key).digest() : key).copy(k)
  const xor = (pad: number) => Buffer.from(k.map((b) => b ^ pad))
  const inner = createHash('sha256').update(xor(0x36)).update(message).digest()
  return createHash('sha256').update(xor(0x5c)).update(inner).digest('hex')
}

const secret = 'mistwell-store-secret-0123456789abcdef'
const body = Buffer.from('{"eventId":"evt-1","type":"order.cancelled","occurredAt":"2026-03-02T15:04:05Z","orderNumber":"WEB-1"}')

describe('store webhook signature', () => {
  it('the HMAC built by definition reproduces RFC 4231 test case 2', () => {
    // RFC 4231, section 4.3: key "Jefe", data "what do ya want for nothing?"
    expect(hmacSha256ByDefinition(Buffer.from('Jefe'), Buffer.from('what do ya want for nothing?'))).toBe(
      '5bdcc146bf60754e6a042426089575c75a003f089d2739839dec58b964ec3843',
    )
  })

  it('signs "<timestamp>.<body>" with HMAC-SHA256 under the secret', () => {
    const expected = hmacSha256ByDefinition(Buffer.from(secret), Buffer.concat([Buffer.from('1772463845.'), body]))
    expect(signStoreDelivery(secret, 1772463845, body)).toBe(`sha256=${expected}`)
  })

  it('accepts a good signature within 5 minutes either way, and says why it refuses anything else', () => {
    const ts = 1772463845
    const signature = signStoreDelivery(secret, ts, body)
    const check = (over: Partial<Parameters<typeof checkStoreSignature>[0]>) =>
      checkStoreSignature({ secret, timestamp: String(ts), signature, rawBody: body, nowSeconds: ts, ...over })
    expect(check({})).toEqual({ ok: true })
    expect(check({ nowSeconds: ts + 300 })).toEqual({ ok: true })
    expect(check({ nowSeconds: ts - 300 })).toEqual({ ok: true })
    expect(check({ signature: signature.toUpperCase().replace('SHA256=', 'sha256=') })).toEqual({ ok: true })
    expect(check({ nowSeconds: ts + 301 })).toEqual({ ok: false, reason: 'timestamp is 301 s old (limit 300 s)' })
    expect(check({ nowSeconds: ts - 301 })).toEqual({ ok: false, reason: 'timestamp is 301 s in the future (limit 300 s)' })
    expect(check({ rawBody: Buffer.from(body.toString().replace('WEB-1', 'WEB-2')) })).toEqual({ ok: false, reason: 'signature does not match the body' })
    expect(check({ secret: `${secret}x` })).toEqual({ ok: false, reason: 'signature does not match the body' })
    // The timestamp is signed too: a fresh timestamp on an old signature fails.
    expect(check({ timestamp: String(ts + 10), nowSeconds: ts + 10 })).toEqual({ ok: false, reason: 'signature does not match the body' })
    expect(check({ signature: undefined })).toEqual({ ok: false, reason: 'no X-Store-Signature header' })
    expect(check({ signature: 'sha1=abc' })).toEqual({ ok: false, reason: 'X-Store-Signature is not sha256=<64 hex digits>' })
    expect(check({ timestamp: undefined })).toEqual({ ok: false, reason: 'no X-Store-Timestamp header' })
    expect(check({ timestamp: '2026-03-02' })).toEqual({ ok: false, reason: 'X-Store-Timestamp is not unix seconds' })
    expect(check({ secret: undefined })).toMatchObject({ ok: false })
  })
})
