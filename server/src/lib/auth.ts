import type { Request, RequestHandler, Response } from 'express'
import { eq } from 'drizzle-orm'
import { SignJWT, jwtVerify } from 'jose'
import type { Role } from '@kitwright/shared/roles'
import type { Db } from '../db/client'
import { users } from '../db/schema/index'

export const SESSION_COOKIE = 'kw_session'

export interface SessionUser {
  id: string
  email: string
  name: string
  role: Role
}

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    interface Request {
      user?: SessionUser
    }
  }
}

export interface TokenConfig {
  secret: Uint8Array
  /** Lifetime of a token; each request past a quarter of it gets a fresh one (sliding renewal). */
  lifetimeSeconds: number
  secureCookies: boolean
}

export async function issueToken(config: TokenConfig, userId: string): Promise<string> {
  return new SignJWT({})
    .setProtectedHeader({ alg: 'HS256' })
    .setSubject(userId)
    .setIssuedAt()
    .setExpirationTime(`${config.lifetimeSeconds}s`)
    .sign(config.secret)
}

/**
 * Secure (sent over HTTPS only) in production when the request came over HTTPS, directly or through a
 * trusted proxy. Over plain HTTP to a shop-network address a browser drops a Secure cookie, so nobody
 * could sign in on a tablet; localhost is exempt in browsers, which hid this on the shop computer.
 */
function secureCookie(res: Response, config: TokenConfig): boolean {
  return config.secureCookies && res.req.secure
}

export async function setSessionCookie(res: Response, config: TokenConfig, userId: string) {
  res.cookie(SESSION_COOKIE, await issueToken(config, userId), {
    httpOnly: true,
    sameSite: 'lax',
    secure: secureCookie(res, config),
    path: '/',
    maxAge: config.lifetimeSeconds * 1000,
  })
}

export function clearSessionCookie(res: Response, config: TokenConfig) {
  res.clearCookie(SESSION_COOKIE, { httpOnly: true, sameSite: 'lax', secure: secureCookie(res, config), path: '/' })
}

/**
 * Reads the session cookie on every request and loads the user from the database, so that a
 * deactivated user or a changed role takes effect at the very next request. Never rejects by
 * itself: the per-route access rule decides.
 */
export function authenticate(db: Db, config: TokenConfig): RequestHandler {
  return async (req, res, next) => {
    const token: unknown = req.cookies?.[SESSION_COOKIE]
    if (typeof token !== 'string' || token === '') return next()
    let userId: string
    let issuedAt: number
    try {
      const { payload } = await jwtVerify(token, config.secret, { algorithms: ['HS256'] })
      if (!payload.sub || payload.iat === undefined) return next()
      userId = payload.sub
      issuedAt = payload.iat
    } catch {
      return next() // expired, tampered or signed with another secret: treated as signed out
    }
    const [row] = await db
      .select({ id: users.id, email: users.email, name: users.name, role: users.role, active: users.active })
      .from(users)
      .where(eq(users.id, userId))
    if (!row || !row.active) return next()
    req.user = { id: row.id, email: row.email, name: row.name, role: row.role }
    if (Date.now() / 1000 - issuedAt > config.lifetimeSeconds / 4) await setSessionCookie(res, config, row.id)
    next()
  }
}

export function currentUser(req: Request): SessionUser {
  if (!req.user) throw new Error('currentUser() called on a route without an access rule that signs in')
  return req.user
}
