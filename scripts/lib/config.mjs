// Ports and folders of the local services. Environment variables override each default.
const num = (name, fallback) => Number(process.env[name] ?? fallback)

export const localPorts = {
  app: num('PORT', 3000),
  api: num('KITWRIGHT_DEV_API_PORT', 3001), // `npm run dev` only: Vite takes PORT and proxies /api here
  postgres: num('KITWRIGHT_PG_PORT', 54329),
  s3: num('FAKE_S3_PORT', 54330),
  smtp: num('FAKE_SMTP_PORT', 54325),
  carrier: num('FAKE_CARRIER_PORT', 54331),
  payments: num('FAKE_PAYMENTS_PORT', 54332),
}

export const bucket = process.env.S3_BUCKET ?? 'kitwright'
