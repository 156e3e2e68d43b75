// Where Kitwright is served: on this computer only (the default), or on the shop network
// (`npm start -- --lan`), over HTTP or HTTPS (`--https`). Works out the addresses to listen on, the
// public address every link and QR code starts with, and the photo store's address for tablets.
import os from 'node:os'

/** This computer's IPv4 addresses on its networks (not loopback), with the interface each is on. */
export function lanAddresses() {
  return Object.entries(os.networkInterfaces()).flatMap(([name, list]) =>
    (list ?? []).filter((a) => a.family === 'IPv4' && !a.internal).map((a) => ({ name, address: a.address })),
  )
}

const originOf = (url) => new URL(url).origin

/**
 * The plan for one start: `{ host, scheme, publicUrl, s3Host, s3PublicUrl, s3Scheme, reachable, certHosts, allowedOrigins }`.
 * Settings in `env` (HOST, PUBLIC_URL, S3_PUBLIC_URL) win over what is derived.
 */
export function servingPlan({ lan, https, appPort, s3Port, env = process.env, addresses = lanAddresses(), hostname = os.hostname() }) {
  if (lan && addresses.length === 0) {
    throw new Error('--lan: this computer has no network address besides loopback (127.0.0.1). Connect it to the shop network (cable or Wi-Fi), then start again.')
  }
  const scheme = https ? 'https' : 'http'
  const host = env.HOST ?? (lan ? '0.0.0.0' : '127.0.0.1')
  const primary = lan ? addresses[0].address : 'localhost'
  const publicUrl = (env.PUBLIC_URL ?? `${scheme}://${primary}:${appPort}`).replace(/\/+$/, '')
  // The S3 stand-in: open to the shop network in LAN mode, and HTTPS when the app is (an https://
  // page may not upload to an http:// address).
  const s3Host = lan ? '0.0.0.0' : '127.0.0.1'
  const s3PublicUrl = env.S3_PUBLIC_URL ?? (lan ? `${scheme}://${primary}:${s3Port}` : undefined)
  const reachable = lan
    ? [
        ...addresses.map((a) => ({ url: `${scheme}://${a.address}:${appPort}`, note: `network ${a.name}` })),
        { url: `${scheme}://${hostname}:${appPort}`, note: "this computer's name, where the network resolves it" },
        { url: `${scheme}://localhost:${appPort}`, note: 'on this computer' },
      ]
    : [{ url: `${scheme}://localhost:${appPort}`, note: 'on this computer only' }]
  const hostOf = (url) => new URL(url).hostname.replace(/^\[|\]$/g, '')
  const certHosts = [...new Set(['localhost', '127.0.0.1', ...(lan ? [hostname, ...addresses.map((a) => a.address)] : []), hostOf(publicUrl), ...(s3PublicUrl ? [hostOf(s3PublicUrl)] : [])])]
  const allowedOrigins = [...new Set([originOf(publicUrl), ...reachable.map((r) => originOf(r.url)), `${scheme}://127.0.0.1:${appPort}`])]
  return { host, scheme, publicUrl, s3Host, s3PublicUrl, reachable, certHosts, allowedOrigins }
}
