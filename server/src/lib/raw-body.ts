import type { IncomingMessage } from 'node:http'

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    interface Request {
      /** The body's bytes exactly as they arrived, for signature checks (JSON bodies only). */
      rawBody?: Buffer
    }
  }
}

/** `express.json({ verify })` hook: keeps the bytes the JSON was parsed from, since a signature covers those, not a re-serialisation. */
export function keepRawBody(req: IncomingMessage, _res: unknown, body: Buffer) {
  ;(req as IncomingMessage & { rawBody?: Buffer }).rawBody = body
}
