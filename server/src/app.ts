import cookieParser from 'cookie-parser'
import express from 'express'
import helmet from 'helmet'
import type { Deps } from './deps'
import { auditRouter } from './features/audit/audit.routes'
import { authRouter } from './features/auth/auth.routes'
import { bagsRouter, unitWeightsRouter } from './features/bag-weights/bag-weights.routes'
import { binsRouter } from './features/bins/bins.routes'
import { cutRunsRouter } from './features/cut-runs/cut-runs.routes'
import { healthRouter } from './features/health/health.routes'
import { kitsRouter, revisionsRouter } from './features/kits/kits.routes'
import { mailRouter } from './features/mail/mail.routes'
import { ordersRouter } from './features/orders/orders.routes'
import { orderPaymentsRouter, paymentsPublicRouter } from './features/payments/payments.routes'
import { partsRouter } from './features/parts/parts.routes'
import { purchaseOrdersRouter, suppliersRouter } from './features/purchasing/purchasing.routes'
import { scanRouter } from './features/scan/scan.routes'
import { settingsRouter } from './features/settings/settings.routes'
import { stockRouter } from './features/stock/stock.routes'
import { usersRouter } from './features/users/users.routes'
import { publicRecordRouter } from './features/build/public-record.routes'
import { buildRouter, unitsRouter } from './features/build/build.routes'
import { packRouter, shipmentsRouter } from './features/pack/pack.routes'
import { customsRouter } from './features/pack/customs.routes'
import { webhooksRouter } from './features/webhooks/webhooks.routes'
import { releaseRouter, shortagesRouter } from './features/work-orders/work-orders.routes'
import { reportsRouter } from './features/reports/reports.routes'
import { returnsRouter } from './features/returns/returns.routes'
import { tabletsRouter } from './features/tablets/tablets.routes'
import { buildLotsRouter, lotsRouter } from './features/lots/lots.routes'
import { authenticate } from './lib/auth'
import { benchActions } from './lib/client-actions'
import { clientFiles, compressAnswers } from './lib/client-files'
import { errorHandler } from './lib/error-handler'
import { NotFound } from './lib/http-errors'
import { requestLogger } from './lib/logger'
import { keepRawBody } from './lib/raw-body'
import { RouteTable } from './lib/routes'
import { photoStoreDirectives } from './lib/storage'

/** Builds the Express app; listens nowhere (index.ts does), so tests drive it with supertest. */
export function createApp(deps: Deps) {
  const app = express()
  const routes = new RouteTable()
  // Which proxies may say what the client's address and scheme were (TRUST_PROXY); req.secure follows it.
  app.set('trust proxy', deps.trustProxy ?? 'loopback')
  app.disable('x-powered-by')
  // helmet's defaults, with a CSP narrowed to what the built client uses: its own scripts, styles and
  // fonts (bundled, no CDN), <style> elements injected at run time (sonner's toasts), and the photo
  // store's public address for presigned uploads and photos. tests/api/security.test.ts checks the
  // bundle against it. HSTS and upgrade-insecure-requests only where the request came over HTTPS
  // (directly, or through a trusted proxy): over plain HTTP on the shop network they would send a
  // tablet to an https:// address nothing answers (tests/api/served-headers.test.ts).
  const directives = { ...photoStoreDirectives(deps.storage), fontSrc: ["'self'"], styleSrc: ["'self'", "'unsafe-inline'"] }
  const overHttps = helmet({ contentSecurityPolicy: { directives } })
  // Cross-Origin-Opener-Policy and Origin-Agent-Cluster are honoured only on a trustworthy origin;
  // over plain HTTP to a shop address Chromium ignores them and logs an error or a warning on every
  // page, so they are sent over HTTPS only.
  const overHttp = helmet({
    contentSecurityPolicy: { directives: { ...directives, upgradeInsecureRequests: null } },
    strictTransportSecurity: false,
    crossOriginOpenerPolicy: false,
    originAgentCluster: false,
  })
  app.use((req, res, next) => (req.secure ? overHttps : overHttp)(req, res, next))
  app.use(requestLogger(deps.logger))
  app.use(compressAnswers())
  app.use(express.json({ limit: '1mb', verify: keepRawBody }))
  app.use(cookieParser())
  app.use('/api', authenticate(deps.db, deps.tokens))
  // A bench action sent with the tablet's id for it is applied once (lib/client-actions.ts).
  app.use('/api', benchActions(deps.db))

  // One line per feature router; each route inside declares who may call it.
  const features = [
    healthRouter,
    authRouter,
    usersRouter,
    settingsRouter,
    auditRouter,
    scanRouter,
    partsRouter,
    kitsRouter,
    revisionsRouter,
    stockRouter,
    webhooksRouter,
    mailRouter,
    ordersRouter,
    orderPaymentsRouter,
    paymentsPublicRouter,
    cutRunsRouter,
    binsRouter,
    releaseRouter,
    shortagesRouter,
    buildRouter,
    buildLotsRouter,
    lotsRouter,
    unitsRouter,
    publicRecordRouter,
    packRouter,
    shipmentsRouter,
    customsRouter,
    reportsRouter,
    tabletsRouter,
    suppliersRouter,
    purchaseOrdersRouter,
    unitWeightsRouter,
    bagsRouter,
  ]
  features.push(returnsRouter)
  for (const feature of features) {
    const { base, router } = feature(deps, routes)
    app.use(base, router)
  }

  app.use('/api', () => {
    throw new NotFound('No such API route')
  })
  if (deps.clientDist) app.use(clientFiles(deps.clientDist))
  app.use(errorHandler)
  return { app, routes }
}
