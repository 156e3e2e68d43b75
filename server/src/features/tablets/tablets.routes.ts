import type { Deps } from '../../deps'
import { NotFound } from '../../lib/http-errors'
import type { RouteTable } from '../../lib/routes'
import { connectTablet, qrSvg } from './tablets.service'

const NO_LOCAL_CA = 'Kitwright is not serving HTTPS with a local certificate authority: start it with `npm start -- --https` to get one.'

/** "Connect a tablet": the address for the shop's tablets as text and QR code, and the local CA to trust. */
export function tabletsRouter(deps: Deps, routes: RouteTable) {
  const r = routes.router('/api/tablets')
  r.get('/connect', ['admin'], (_req, res) => {
    res.json(connectTablet(deps))
  })
  r.get('/sign-in-qr.svg', ['admin'], async (_req, res) => {
    res.type('image/svg+xml').set('Cache-Control', 'no-store').send(await qrSvg(connectTablet(deps).signInUrl))
  })
  r.get('/ca-certificate-qr.svg', ['admin'], async (_req, res) => {
    const url = connectTablet(deps).caCertificateUrl
    if (!url) throw new NotFound(NO_LOCAL_CA)
    res.type('image/svg+xml').set('Cache-Control', 'no-store').send(await qrSvg(url))
  })
  // Public on purpose: a tablet downloads it before anyone can sign in on it, and a CA certificate
  // holds no secret (its private key never leaves .data/tls/).
  r.get('/ca-certificate.crt', 'public', (_req, res) => {
    const der = deps.served?.caCertificate
    if (!der) throw new NotFound(NO_LOCAL_CA)
    res.type('application/x-x509-ca-cert').attachment('kitwright-local-ca.crt').send(der)
  })
  return r
}
