import type pg from 'pg'
import type { Db } from './db/client'
import type { TokenConfig } from './lib/auth'
import type { Logger } from './lib/logger'

/** Everything the app needs from outside; built from the environment in index.ts, by hand in tests. */
export interface Deps {
  db: Db
  pool: pg.Pool
  logger: Logger
  tokens: TokenConfig
  /** Folder of the built client to serve, when the API also serves the app. */
  clientDist?: string
}
