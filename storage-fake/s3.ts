import { mkdirSync } from 'node:fs'
import S3rver from 's3rver'

// Browsers upload photos straight to the bucket with presigned PUTs, from the app's origin: the rule
// names the app's origins when they are known (npm start passes them), else any origin (the tests'
// own stand-in, whose app port is chosen later).
function corsRule(allowedOrigins: readonly string[]) {
  const origins = (allowedOrigins.length > 0 ? allowedOrigins : ['*']).map((o) => `    <AllowedOrigin>${o}</AllowedOrigin>`).join('\n')
  return `<CORSConfiguration>
  <CORSRule>
${origins}
    <AllowedMethod>GET</AllowedMethod>
    <AllowedMethod>PUT</AllowedMethod>
    <AllowedMethod>HEAD</AllowedMethod>
    <AllowedHeader>*</AllowedHeader>
    <ExposeHeader>ETag</ExposeHeader>
    <MaxAgeSeconds>3000</MaxAgeSeconds>
  </CORSRule>
</CORSConfiguration>`
}

/**
 * The local S3 stand-in: s3rver, keys S3RVER/S3RVER, the bucket created with its CORS rule. It
 * listens on 127.0.0.1 unless given `address` (0.0.0.0 in LAN mode, so tablets reach it), and speaks
 * HTTPS when given a certificate (an https:// page may not upload to an http:// store).
 */
export async function startS3Fake(opts: { port: number; directory: string; bucket: string; address?: string; allowedOrigins?: readonly string[]; tls?: { cert: Buffer; key: Buffer } }) {
  mkdirSync(opts.directory, { recursive: true })
  const server = new S3rver({
    address: opts.address ?? '127.0.0.1',
    port: opts.port,
    directory: opts.directory,
    silent: true,
    ...(opts.tls ? { cert: opts.tls.cert, key: opts.tls.key } : {}),
    configureBuckets: [{ name: opts.bucket, configs: [corsRule(opts.allowedOrigins ?? [])] }],
  })
  await server.run()
  return { close: () => server.close() }
}
