/** What an action id is made from: the browser's `crypto` (or, in a test, one without `randomUUID`). */
export interface IdSource {
  getRandomValues(bytes: Uint8Array<ArrayBuffer>): Uint8Array
  randomUUID?: () => string
}

/**
 * A random (version 4) UUID for a bench action. `crypto.randomUUID` exists only on a secure page
 * (HTTPS or this machine); a tablet on the shop's plain-HTTP address still has
 * `crypto.getRandomValues`, so the id is built from that (RFC 9562, section 5.4).
 */
export function newActionId(source: IdSource = crypto): string {
  if (typeof source.randomUUID === 'function') return source.randomUUID()
  const b = source.getRandomValues(new Uint8Array(16))
  b[6] = (b[6]! & 0x0f) | 0x40
  b[8] = (b[8]! & 0x3f) | 0x80
  const hex = [...b].map((x) => x.toString(16).padStart(2, '0')).join('')
  return `${hex.slice(0, 8)}-${hex.slice(8, 12)}-${hex.slice(12, 16)}-${hex.slice(16, 20)}-${hex.slice(20)}`
}
