import type { Express } from 'express'
import type { RouteTable } from './routes'

type Layer = { route?: { path: string; methods: Record<string, boolean> }; handle?: { stack?: Layer[] } }

/**
 * Every route Express really has (`get /:id`, `post /store` …), read from its router stack rather
 * than from our own records. Paths are as each router knows them, without the mount point.
 */
export function expressRoutes(app: Express): string[] {
  const found: string[] = []
  const walk = (stack: Layer[]) => {
    for (const layer of stack) {
      if (layer.route) for (const m of Object.keys(layer.route.methods)) found.push(`${m} ${layer.route.path}`)
      else if (layer.handle?.stack) walk(layer.handle.stack)
    }
  }
  walk((app as unknown as { router: { stack: Layer[] } }).router.stack)
  return found
}

/** The routes of the table in the same form as `expressRoutes`. */
export function declaredRoutes(table: RouteTable): string[] {
  return table.records.map((r) => `${r.method} ${r.routerPath}`)
}

/**
 * Routes Express has that the table does not declare (added behind its back, with no access rule),
 * leaving out the client's page fallback, which is not an API route.
 */
export function undeclaredRoutes(app: Express, table: RouteTable): string[] {
  const left = [...declaredRoutes(table)]
  const extra: string[] = []
  for (const route of expressRoutes(app)) {
    if (route.endsWith(' /*splat') || route.startsWith('get /.*')) continue
    const i = left.indexOf(route)
    if (i >= 0) left.splice(i, 1)
    else extra.push(route)
  }
  return extra
}
