/** The base database URL `npm test` hands to the suite; every test database is named after it. */
export function testDatabaseUrl(suffix: string): string {
  const base = process.env.TEST_DATABASE_URL
  if (!base) throw new Error('TEST_DATABASE_URL is not set: run the suite with `npm test`, which starts PostgreSQL')
  const url = new URL(base)
  url.pathname = `${url.pathname}_${suffix}`
  return url.toString()
}

export function databaseName(url: string) {
  return decodeURIComponent(new URL(url).pathname.slice(1))
}

export function adminUrl(url: string) {
  const admin = new URL(url)
  admin.pathname = '/postgres'
  return admin.toString()
}
