import { isIP } from 'node:net'
import QRCode from 'qrcode'
import { BENCH_SIGN_IN_PATH, CA_CERTIFICATE_PATH, type ConnectTablet } from '@kitwright/shared/tablets'
import type { Deps } from '../../deps'

/** A host only this computer can reach: a name for itself or a loopback address. */
export function isLoopbackHost(host: string): boolean {
  const h = host.replace(/^\[|\]$/g, '').toLowerCase()
  if (h === 'localhost' || h.endsWith('.localhost')) return true
  if (isIP(h) === 4) return h.startsWith('127.')
  return h === '::1'
}

/** What a tablet needs to reach this Kitwright, and what stops it, from how the process is served. */
export function connectTablet(deps: Pick<Deps, 'publicUrl' | 'served' | 'storage'>): ConnectTablet {
  const publicUrl = new URL(deps.publicUrl)
  const served = deps.served ?? { listenHost: '127.0.0.1', https: false, caCertificate: null }
  const problems: string[] = []
  if (isLoopbackHost(served.listenHost)) {
    problems.push(
      `Kitwright listens on this computer only (HOST=${served.listenHost}). Restart it with \`npm start -- --lan\` (or set HOST=0.0.0.0) so the shop network reaches it.`,
    )
  }
  if (isLoopbackHost(publicUrl.hostname)) {
    problems.push(
      `The public address ${publicUrl.origin} names this computer to itself; a tablet cannot open it. \`npm start -- --lan\` uses the shop-network address, or set PUBLIC_URL to it.`,
    )
  }
  if (deps.storage.origin && isLoopbackHost(new URL(deps.storage.origin).hostname)) {
    problems.push(
      `The photo store's address ${deps.storage.origin} is on this computer only, so tablets cannot upload photos. \`npm start -- --lan\` opens the local store to the shop network, or set S3_PUBLIC_URL to the store's address on the network.`,
    )
  }
  const origin = publicUrl.origin
  return {
    publicUrl: origin,
    signInUrl: `${origin}${BENCH_SIGN_IN_PATH}`,
    https: publicUrl.protocol === 'https:',
    problems,
    caCertificateUrl: served.caCertificate ? `${origin}${CA_CERTIFICATE_PATH}` : null,
  }
}

/** A QR code as SVG, black on white with the standard 4-module quiet zone (ISO/IEC 18004). */
export function qrSvg(text: string): Promise<string> {
  return QRCode.toString(text, { type: 'svg', errorCorrectionLevel: 'M', margin: 4, color: { dark: '#000000', light: '#ffffff' } })
}
