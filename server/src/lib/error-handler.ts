import type { ErrorRequestHandler } from 'express'
import { ZodError, type z } from 'zod'
import { HttpError } from './http-errors'

// PostgreSQL and pg error codes that mean the database cannot be reached right now.
const DB_DOWN_CODES = new Set(['ECONNREFUSED', 'ECONNRESET', 'ETIMEDOUT', '57P01', '57P02', '57P03', '08006', '08001'])

function isDatabaseDown(err: unknown): boolean {
  if (!(err instanceof Error)) return false
  const code = (err as { code?: unknown }).code
  if (typeof code === 'string' && DB_DOWN_CODES.has(code)) return true
  if (/timeout exceeded when trying to connect|Connection terminated/i.test(err.message)) return true
  return err.cause !== undefined && isDatabaseDown(err.cause)
}

/**
 * A union that matched no branch reports the branch that came closest (fewest issues), so the
 * caller learns which field to fix rather than a bare "Invalid input".
 */
function flattenUnions(issues: readonly z.core.$ZodIssue[], prefix: PropertyKey[] = []): z.core.$ZodIssue[] {
  return issues.flatMap((issue) => {
    const path = [...prefix, ...issue.path]
    if (issue.code === 'invalid_union' && issue.errors.length > 0) {
      const closest = [...issue.errors].sort((a, b) => a.length - b.length)[0]!
      return flattenUnions(closest, path)
    }
    return [{ ...issue, path }]
  })
}

/** What to say about a request Express or the body parser could not read (their errors carry a 4xx status). */
function unreadableMessage(err: unknown, status: number): string {
  const type = (err as { type?: unknown }).type
  if (status === 413) return 'The request body is too large'
  if (status === 415) return 'Send the request body as UTF-8 JSON'
  if (err instanceof Error && err.message.startsWith('Failed to decode param')) return 'Part of the address is not valid URL encoding; check the link or the scanned code'
  if (type === 'entity.parse.failed') return 'The request body is not valid JSON'
  return 'The request could not be read; send it again'
}

/** Turns every error into the one JSON error shape; only unexpected errors are logged with their stack. */
export const errorHandler: ErrorRequestHandler = (err: unknown, req, res, _next) => {
  // A handler may have promised a file (a PDF, a CSV download) before it failed; the answer is JSON now.
  if (!res.headersSent) {
    res.removeHeader('Content-Disposition')
    res.type('application/json')
  }
  if (err instanceof ZodError) {
    const issues = flattenUnions(err.issues)
    const fields: Record<string, string> = {}
    for (const issue of issues) {
      const path = issue.path.join('.') || '_'
      fields[path] ??= issue.message
    }
    const first = issues[0]
    const where = first && first.path.length > 0 ? `${first.path.join('.')}: ` : ''
    res.status(400).json({ error: { code: 'invalid', message: `${where}${first?.message ?? 'Invalid input'}`, fields } })
    return
  }
  if (err instanceof HttpError) {
    res.status(err.status).json({ error: { code: err.code, message: err.message, ...(err.fields ? { fields: err.fields } : {}) } })
    return
  }
  // body-parser errors (malformed JSON, body too large) carry a 4xx status of their own.
  const status = (err as { status?: unknown }).status
  if (typeof status === 'number' && status >= 400 && status < 500) {
    res.status(status).json({ error: { code: 'invalid', message: unreadableMessage(err, status) } })
    return
  }
  if (isDatabaseDown(err)) {
    req.log.warn({ err }, 'database unavailable')
    res.status(503).json({ error: { code: 'unavailable', message: 'The database is not reachable; try again in a moment' } })
    return
  }
  req.log.error({ err }, 'unhandled error')
  res.status(500).json({ error: { code: 'internal', message: 'Something went wrong on the server; it has been logged' } })
}
