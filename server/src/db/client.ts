import { drizzle } from 'drizzle-orm/node-postgres'
import pg from 'pg'
import * as schema from '../db/schema/index'

export function createDb(url: string) {
  // A short connection timeout lets health and requests answer 503 quickly when PostgreSQL is down.
  const pool = new pg.Pool({ connectionString: url, max: 10, connectionTimeoutMillis: 3000 })
  // An idle client losing its server must not crash the process; the next query reconnects.
  pool.on('error', () => {})
  const db = drizzle({ client: pool, schema, casing: 'snake_case' })
  return { db, pool }
}

export type Db = ReturnType<typeof createDb>['db']
export type Tx = Parameters<Parameters<Db['transaction']>[0]>[0]
