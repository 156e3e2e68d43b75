import { describe, expect, it } from 'vitest'
import { BenchActionHeadersSchema } from '@kitwright/shared/bench-actions'
import { newActionId } from './uuid'

// RFC 9562, section 5.4: a version 4 UUID has 0100 in bits 48–51 (the 13th hex digit is 4) and the
// variant 10 in bits 64–65 (the 17th hex digit is 8, 9, a or b).
const V4 = /^[0-9a-f]{8}-[0-9a-f]{4}-4[0-9a-f]{3}-[89ab][0-9a-f]{3}-[0-9a-f]{12}$/

describe('bench action ids', () => {
  it('made from getRandomValues on a plain-HTTP page are version 4 UUIDs (RFC 9562, 5.4) the server accepts', () => {
    const plainHttp = { getRandomValues: (bytes: Uint8Array<ArrayBuffer>) => crypto.getRandomValues(bytes) }
    const ids = Array.from({ length: 2000 }, () => newActionId(plainHttp))
    for (const id of ids) expect(id).toMatch(V4)
    expect(new Set(ids).size).toBe(ids.length)
    expect(BenchActionHeadersSchema.safeParse({ id: ids[0], takenAt: new Date().toISOString() }).success).toBe(true)
  })

  it('use the browser’s own randomUUID where the page is secure', () => {
    const id = newActionId()
    expect(id).toMatch(V4)
  })

  it('set the version and variant bits whatever the random bytes are', () => {
    for (const fill of [0x00, 0xff]) {
      const id = newActionId({ getRandomValues: (bytes) => bytes.fill(fill) })
      expect(id).toMatch(V4)
    }
    expect(newActionId({ getRandomValues: (bytes) => bytes.fill(0) })).toBe('00000000-0000-4000-8000-000000000000')
  })
})
