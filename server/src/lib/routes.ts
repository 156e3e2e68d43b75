import { Router, type RequestHandler } from 'express'
import { ROLES, type Role } from '@kitwright/shared/roles'
import { Forbidden, Unauthenticated } from './http-errors'

/**
 * Every route declares who may call it: anyone (`public`), any signed-in user (`signed-in`), or a
 * list of roles. The declaration is required by the type of `add`, and each one is recorded so the
 * access tests can call every route as every role without keeping a list by hand.
 */
export type Access = 'public' | 'signed-in' | readonly Role[]

export interface RouteRecord {
  method: 'get' | 'post' | 'put' | 'patch' | 'delete'
  /** The full path, e.g. `/api/users/:id`. */
  path: string
  /** The path as its router knows it, without the mount point, e.g. `/:id`. */
  routerPath: string
  access: Access
}

export function accessGuard(access: Access): RequestHandler {
  return (req, _res, next) => {
    if (access === 'public') return next()
    if (!req.user) throw new Unauthenticated()
    if (access !== 'signed-in' && !access.includes(req.user.role)) throw new Forbidden()
    next()
  }
}

/** Refuses, at registration, a route whose access rule is missing or names no known role. */
export function assertAccess(access: unknown, where: string): asserts access is Access {
  if (access === 'public' || access === 'signed-in') return
  if (Array.isArray(access) && access.length > 0 && access.every((r) => (ROLES as readonly unknown[]).includes(r))) return
  throw new Error(`Route ${where} declares no access rule: give 'public', 'signed-in' or a list of roles`)
}

export class RouteTable {
  readonly records: RouteRecord[] = []

  /** A router mounted at `base` whose every route must declare its access. */
  router(base: string) {
    const router = Router()
    const add =
      (method: RouteRecord['method']) =>
      (path: string, access: Access, ...handlers: RequestHandler[]) => {
        assertAccess(access, `${method.toUpperCase()} ${base}${path}`)
        this.records.push({ method, path: base + (path === '/' ? '' : path), routerPath: path, access })
        router[method](path, accessGuard(access), ...handlers)
      }
    return {
      base,
      router,
      get: add('get'),
      post: add('post'),
      put: add('put'),
      patch: add('patch'),
      delete: add('delete'),
    }
  }
}
