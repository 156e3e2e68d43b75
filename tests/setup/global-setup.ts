import { createDb } from '../../server/src/db/client'
import { ensureDatabase } from '../../server/src/db/ensure-database'
import { migrateDb } from '../../server/src/db/migrate'
import { testDatabaseUrl } from '../support/env'

/** Migrates a template database once per run; each test file copies it (CREATE DATABASE … TEMPLATE). */
export default async function setup() {
  const url = testDatabaseUrl('template')
  await ensureDatabase(url, { recreate: true })
  const { db, pool } = createDb(url)
  try {
    await migrateDb(db)
  } finally {
    await pool.end()
  }
}
