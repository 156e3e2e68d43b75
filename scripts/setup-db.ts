// Creates the database if needed, applies the migrations and loads the demo data. Idempotent.
import { createDb } from '../server/src/db/client'
import { ensureDatabase } from '../server/src/db/ensure-database'
import { migrateDb } from '../server/src/db/migrate'
import { seedDemo } from '../server/src/seeds/demo'

const url = process.env.DATABASE_URL
if (!url) throw new Error('DATABASE_URL is not set')
const only = process.argv[2] // 'migrate' | 'seed' | undefined (both)

await ensureDatabase(url)
const { db, pool } = createDb(url)
try {
  if (only !== 'seed') {
    console.log('[kitwright] applying migrations')
    await migrateDb(db)
  }
  if (only !== 'migrate') {
    console.log('[kitwright] loading demo data')
    await seedDemo(db)
  }
} finally {
  await pool.end()
}
