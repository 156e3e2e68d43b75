import pg from 'pg'

/** Creates the database named in `url` when it does not exist yet (connecting to `postgres` to do so). */
export async function ensureDatabase(url: string, { recreate = false } = {}) {
  const target = new URL(url)
  const name = decodeURIComponent(target.pathname.slice(1))
  if (!/^[a-z0-9_]+$/.test(name)) throw new Error(`Database name "${name}" must be lower-case letters, digits and _`)
  const admin = new URL(url)
  admin.pathname = '/postgres'
  const client = new pg.Client({ connectionString: admin.toString() })
  await client.connect()
  try {
    if (recreate) await client.query(`drop database if exists ${name} with (force)`)
    const { rowCount } = await client.query('select 1 from pg_database where datname = $1', [name])
    if (!rowCount) await client.query(`create database ${name}`)
  } finally {
    await client.end()
  }
}
