import { GetObjectCommand, HeadObjectCommand, PutObjectCommand, S3Client } from '@aws-sdk/client-s3'
import { getSignedUrl } from '@aws-sdk/s3-request-presigner'
import { Unavailable } from './http-errors'

/** Where the unit photos live: any S3-compatible store (s3rver locally). */
export interface StorageConfig {
  /** Omitted for AWS itself; set for any other S3-compatible store (and for s3rver). */
  endpoint?: string
  /**
   * The store's address as browsers reach it (S3_PUBLIC_URL), when it differs from `endpoint`: a
   * tablet on the shop network cannot reach the 127.0.0.1 the server talks to. Presigned URLs are
   * signed for this host; the server itself never calls it.
   */
  publicEndpoint?: string
  bucket: string
  accessKeyId: string
  secretAccessKey: string
  region: string
}

/** What a HEAD found: the stored object's type and size. */
export interface StoredObject {
  contentType: string | null
  size: number | null
}

/** The object store as the app uses it: presigned uploads and reads, and HEAD to confirm an upload. */
export interface Storage {
  /** The origin browsers talk to for uploads and thumbnails (for the page's content security policy). */
  readonly origin: string | null
  /**
   * A URL the browser PUTs one object to, with the content type and length signed in: a PUT with
   * another type or size is refused by the store.
   */
  presignPut(key: string, object: { contentType: string; size: number }, expiresInSeconds: number): Promise<{ url: string; headers: Record<string, string> }>
  presignGet(key: string, expiresInSeconds: number): Promise<string>
  /** The object's type and size, or null when there is no such object. Throws `Unavailable` when the store cannot be reached. */
  head(key: string): Promise<StoredObject | null>
}

const UNREACHABLE = 'The photo store (S3) is not reachable right now; the ticks already made are kept. Try the photo again in a moment.'
const NOT_CONFIGURED = 'No photo store is configured: set S3_BUCKET, S3_ACCESS_KEY_ID and S3_SECRET_ACCESS_KEY (and S3_ENDPOINT for a store other than AWS).'

function httpStatus(err: unknown): number | undefined {
  const meta = (err as { $metadata?: { httpStatusCode?: number } }).$metadata
  return meta?.httpStatusCode
}

/** The S3 client per ../shared/STACK-NOTES.md: path-style, and checksums only when required (s3rver stores framed data otherwise). */
export function createStorage(config: StorageConfig | null): Storage {
  if (!config) {
    const fail = () => Promise.reject(new Unavailable(NOT_CONFIGURED))
    return { origin: null, presignPut: fail, presignGet: fail, head: fail }
  }
  const clientFor = (endpoint: string | undefined) =>
    new S3Client({
      region: config.region,
      endpoint,
      forcePathStyle: true,
      credentials: { accessKeyId: config.accessKeyId, secretAccessKey: config.secretAccessKey },
      requestChecksumCalculation: 'WHEN_REQUIRED',
      responseChecksumValidation: 'WHEN_REQUIRED',
      maxAttempts: 2,
      requestHandler: { connectionTimeout: 3000, requestTimeout: 10_000 },
    })
  const client = clientFor(config.endpoint)
  // The signature covers the host, so browser-facing URLs are signed by a client of the public address.
  const presigner = config.publicEndpoint ? clientFor(config.publicEndpoint) : client
  const browserEndpoint = config.publicEndpoint ?? config.endpoint
  const origin = browserEndpoint ? new URL(browserEndpoint).origin : `https://s3.${config.region}.amazonaws.com`
  return {
    origin,
    async presignPut(key, object, expiresIn) {
      const command = new PutObjectCommand({ Bucket: config.bucket, Key: key, ContentType: object.contentType, ContentLength: object.size })
      // The presigner leaves content-type unsigned unless told; signing both binds the upload to what was promised.
      const url = await getSignedUrl(presigner, command, { expiresIn, signableHeaders: new Set(['content-type', 'content-length']) })
      return { url, headers: { 'content-type': object.contentType } }
    },
    presignGet(key, expiresIn) {
      return getSignedUrl(presigner, new GetObjectCommand({ Bucket: config.bucket, Key: key }), { expiresIn })
    },
    async head(key) {
      try {
        const out = await client.send(new HeadObjectCommand({ Bucket: config.bucket, Key: key }))
        return { contentType: out.ContentType ?? null, size: out.ContentLength ?? null }
      } catch (err) {
        if (httpStatus(err) === 404) return null
        throw new Unavailable(UNREACHABLE)
      }
    },
  }
}

/** The storage settings from the environment, or null when no bucket is configured. */
export function storageConfigFromEnv(env: {
  S3_ENDPOINT?: string
  S3_PUBLIC_URL?: string
  S3_BUCKET?: string
  S3_ACCESS_KEY_ID?: string
  S3_SECRET_ACCESS_KEY?: string
  S3_REGION: string
}): StorageConfig | null {
  if (!env.S3_BUCKET || !env.S3_ACCESS_KEY_ID || !env.S3_SECRET_ACCESS_KEY) return null
  return {
    endpoint: env.S3_ENDPOINT,
    publicEndpoint: env.S3_PUBLIC_URL,
    bucket: env.S3_BUCKET,
    accessKeyId: env.S3_ACCESS_KEY_ID,
    secretAccessKey: env.S3_SECRET_ACCESS_KEY,
    region: env.S3_REGION,
  }
}

/**
 * The page's content security policy lets the browser upload to and show photos from the store's
 * public address, and nothing else (helmet's defaults allow only the app's own origin).
 */
export function photoStoreDirectives(storage: Pick<Storage, 'origin'>) {
  const store = storage.origin ? [storage.origin] : []
  return { imgSrc: ["'self'", ...store], connectSrc: ["'self'", ...store] }
}
