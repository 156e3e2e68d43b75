import { z } from 'zod'

/** Where a tablet lands from the QR code: the sign-in page with the bench PIN form open. */
export const BENCH_SIGN_IN_PATH = '/sign-in?with=pin'

/** The local certificate authority's certificate, for tablets to install when Kitwright serves HTTPS with it. */
export const CA_CERTIFICATE_PATH = '/api/tablets/ca-certificate.crt'

/**
 * What "Connect a tablet" shows the owner: the address a tablet opens (also drawn as a QR code),
 * whether tablets can reach it at all, and, over HTTPS with a local authority, the certificate to
 * trust first.
 */
export const ConnectTabletSchema = z.object({
  /** The app's public address (PUBLIC_URL). */
  publicUrl: z.string().url(),
  /** The bench sign-in page at the public address: what the QR code holds. */
  signInUrl: z.string().url(),
  /** Served over HTTPS: tablet browsers then allow the camera scanner. */
  https: z.boolean(),
  /** Each reason a tablet on the shop network cannot use the app yet, with what to change; empty when all is set. */
  problems: z.array(z.string()),
  /** The local certificate authority to trust on each tablet, when the app serves HTTPS with one. */
  caCertificateUrl: z.string().url().nullable(),
})
/** What "Connect a tablet" shows the owner. */
export type ConnectTablet = z.infer<typeof ConnectTabletSchema>
