import { randomBytes } from 'node:crypto'
import { sql } from 'drizzle-orm'
import pg from 'pg'
import { createDb, type Db } from '../../server/src/db/client'
import { adminUrl, databaseName, testDatabaseUrl } from './env'

export interface TestDb {
  db: Db
  pool: pg.Pool
  url: string
  /** Empties every table (keeps the schema), for a clean slate between tests. */
  truncate(): Promise<void>
  /** Runs `stop` first thing in `drop()` (e.g. the job queue that polls this database). */
  onDrop(stop: () => Promise<void>): void
  drop(): Promise<void>
}

/** A fresh database for one test file, copied from the migrated template. */
export async function createTestDb(): Promise<TestDb> {
  const template = testDatabaseUrl('template')
  const url = testDatabaseUrl(`f${randomBytes(5).toString('hex')}`)
  const admin = new pg.Client({ connectionString: adminUrl(template) })
  await admin.connect()
  await admin.query(`create database ${databaseName(url)} template ${databaseName(template)}`)
  await admin.end()
  const { db, pool } = createDb(url)
  const stops: (() => Promise<void>)[] = []
  return {
    db,
    pool,
    url,
    async truncate() {
      const { rows } = await pool.query<{ name: string }>(
        "select quote_ident(tablename) as name from pg_tables where schemaname = 'public'",
      )
      if (rows.length) await db.execute(sql.raw(`truncate ${rows.map((r) => r.name).join(', ')} cascade`))
    },
    onDrop(stop) {
      stops.push(stop)
    },
    async drop() {
      for (const stop of stops.splice(0).reverse()) await stop()
      await pool.end()
      const client = new pg.Client({ connectionString: adminUrl(template) })
      await client.connect()
      await client.query(`drop database if exists ${databaseName(url)} with (force)`)
      await client.end()
    },
  }
}
