import { mkdirSync } from 'node:fs'
import S3rver from 's3rver'

// Browsers upload photos straight to the bucket with presigned PUTs, from the app's origin.
const CORS = `<CORSConfiguration>
  <CORSRule>
    <AllowedOrigin>*</AllowedOrigin>
    <AllowedMethod>GET</AllowedMethod>
    <AllowedMethod>PUT</AllowedMethod>
    <AllowedMethod>HEAD</AllowedMethod>
    <AllowedHeader>*</AllowedHeader>
    <ExposeHeader>ETag</ExposeHeader>
    <MaxAgeSeconds>3000</MaxAgeSeconds>
  </CORSRule>
</CORSConfiguration>`

/** The local S3 stand-in: s3rver on 127.0.0.1, keys S3RVER/S3RVER, the bucket created with CORS. */
export async function startS3Fake(opts: { port: number; directory: string; bucket: string }) {
  mkdirSync(opts.directory, { recursive: true })
  const server = new S3rver({
    address: '127.0.0.1',
    port: opts.port,
    directory: opts.directory,
    silent: true,
    configureBuckets: [{ name: opts.bucket, configs: [CORS] }],
  })
  await server.run()
  return { close: () => server.close() }
}
