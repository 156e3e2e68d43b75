import type { ApiErrorBody } from '@kitwright/shared/errors'

type Code = ApiErrorBody['error']['code']

/** A typed error that the error handler turns into `{ error: { code, message, fields? } }`. */
export class HttpError extends Error {
  constructor(
    readonly status: number,
    readonly code: Code,
    message: string,
    readonly fields?: Record<string, string>,
  ) {
    super(message)
  }
}

export class BadRequest extends HttpError {
  constructor(message: string, fields?: Record<string, string>) {
    super(400, 'invalid', message, fields)
  }
}
export class Unauthenticated extends HttpError {
  constructor(message = 'Sign in to continue') {
    super(401, 'unauthenticated', message)
  }
}
export class Forbidden extends HttpError {
  constructor(message = 'Your role may not do this') {
    super(403, 'forbidden', message)
  }
}
export class NotFound extends HttpError {
  constructor(message: string) {
    super(404, 'not_found', message)
  }
}
export class Conflict extends HttpError {
  constructor(message: string, fields?: Record<string, string>) {
    super(409, 'conflict', message, fields)
  }
}
export class TooManyRequests extends HttpError {
  constructor(message: string) {
    super(429, 'too_many_requests', message)
  }
}
export class Unavailable extends HttpError {
  constructor(message: string) {
    super(503, 'unavailable', message)
  }
}
