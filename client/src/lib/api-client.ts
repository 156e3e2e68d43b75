import type { z } from 'zod'
import { ApiErrorBodySchema, type ApiErrorBody } from '@kitwright/shared/errors'
import { deviceBench } from './bench-device'

/** A non-2xx answer from the API, with the server's message and per-field hints. */
export class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly body: ApiErrorBody['error'],
  ) {
    super(body.message)
  }
}

/**
 * The request never reached the server (no network, the Wi-Fi dropped, or no answer in time).
 * Bench actions wait in the tablet's queue on this error (lib/offline/); anything else says so.
 */
export class NetworkError extends Error {
  constructor(cause: unknown) {
    super('No network: the server could not be reached. Check the Wi-Fi and try again.', { cause })
  }
}

/**
 * Where a request comes from, for the audit trail: a bench page, else the bench this device
 * stands at (its sign-in screen, the build record opened at the bench), else the office.
 */
function benchOfPage(): string {
  const m = /^\/bench\/(cut|build|pack)\b/.exec(window.location.pathname)
  return m ? m[1]! : (deviceBench() ?? 'office')
}

/** The only caller of fetch: throws ApiError on a non-2xx and parses the JSON with `schema`. */
export async function apiFetch<S extends z.ZodType>(
  path: string,
  schema: S,
  init: Omit<RequestInit, 'body'> & { body?: unknown } = {},
): Promise<z.infer<S>> {
  const { body, ...rest } = init
  let res: Response
  try {
    res = await fetch(`/api${path}`, {
      credentials: 'same-origin',
      ...rest,
      headers: { 'x-kitwright-bench': benchOfPage(), ...(body !== undefined ? { 'content-type': 'application/json' } : {}), ...rest.headers },
      body: body === undefined ? undefined : JSON.stringify(body),
    })
  } catch (err) {
    // A request the page itself called off (it moved on) is not a network problem: pass it on as it is.
    const timedOut = rest.signal?.reason instanceof DOMException && rest.signal.reason.name === 'TimeoutError'
    if (rest.signal?.aborted && !timedOut) throw err
    throw new NetworkError(err)
  }
  if (!res.ok) {
    const json: unknown = await res.json().catch(() => null)
    const parsed = ApiErrorBodySchema.safeParse(json)
    throw new ApiError(
      res.status,
      parsed.success ? parsed.data.error : { code: 'internal', message: `The server answered ${res.status} ${res.statusText}` },
    )
  }
  if (res.status === 204) return schema.parse(undefined)
  return schema.parse(await res.json())
}
