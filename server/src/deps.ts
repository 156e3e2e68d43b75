import type pg from 'pg'
import type { Db } from './db/client'
import type { PaymentService } from './features/payments/payment-service'
import type { Carrier } from './features/shipping/carrier'
import type { TokenConfig } from './lib/auth'
import type { Jobs } from './lib/jobs'
import type { Logger } from './lib/logger'
import type { Storage } from './lib/storage'

/** Everything the app needs from outside; built from the environment in index.ts, by hand in tests. */
export interface Deps {
  db: Db
  pool: pg.Pool
  logger: Logger
  tokens: TokenConfig
  /** The PostgreSQL-backed job queue (pg-boss): webhook processing and e-mail run through it. */
  jobs: Jobs
  /** Where customer e-mail goes out: an SMTP relay (or the local catcher) and the sender address. */
  mail: { smtpUrl?: string; from: string }
  /** Shared with the web store to sign webhook deliveries; without it the webhook refuses every delivery. */
  storeWebhookSecret?: string
  /** The S3-compatible store of unit photos (browsers upload to it with presigned URLs). */
  storage: Storage
  /** The carrier that sells shipping labels; without one the pack bench cannot buy a label. */
  carrier?: Carrier | null
  /** The address people and tablets reach the app by (PUBLIC_URL): every e-mail link, signed record link and QR code starts with it. */
  publicUrl: string
  /** Which proxies to believe about the client's address and X-Forwarded-Proto (Express `trust proxy`, TRUST_PROXY); default loopback. */
  trustProxy?: boolean | number | string[]
  /** How this process is served, for "Connect a tablet": the address it listens on and the local CA tablets install for HTTPS. */
  served?: { listenHost: string; https: boolean; caCertificate: Buffer | null }
  /** The hosted payment service for phone orders' payment links; null when none is set up. */
  payments?: PaymentService | null
  /** Folder of the built client to serve, when the API also serves the app. */
  clientDist?: string
  /** The clock the reports read "today" (UTC) and "as of" from; the system clock unless a test fixes the instant. */
  now?: () => Date
}
