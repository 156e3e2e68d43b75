import express, { type RequestHandler } from 'express'
import { describe, expect, it } from 'vitest'
import { undeclaredRoutes } from './route-inventory'
import { RouteTable, type Access } from './routes'

const ok: RequestHandler = (_req, res) => {
  res.json({ ok: true })
}

describe('RouteTable', () => {
  it('records each route with its access rule', () => {
    const table = new RouteTable()
    const r = table.router('/api/things')
    r.get('/', 'signed-in', ok)
    r.post('/:id/tick', ['admin', 'cutter'], ok)
    expect(table.records).toEqual([
      { method: 'get', path: '/api/things', routerPath: '/', access: 'signed-in' },
      { method: 'post', path: '/api/things/:id/tick', routerPath: '/:id/tick', access: ['admin', 'cutter'] },
    ])
  })

  it('refuses to register a route without an access rule, or with an empty or unknown one', () => {
    const r = new RouteTable().router('/api/things')
    // A handler where the rule belongs: the type forbids it, and so does the table at run time.
    expect(() => r.get('/', ok as unknown as Access)).toThrow(/GET \/api\/things\/ declares no access rule/)
    expect(() => r.post('/x', undefined as unknown as Access, ok)).toThrow(/declares no access rule/)
    expect(() => r.patch('/x', [] as unknown as Access, ok)).toThrow(/declares no access rule/)
    expect(() => r.delete('/x', ['owner'] as unknown as Access, ok)).toThrow(/declares no access rule/)
    expect(() => r.put('/x', 'anyone' as unknown as Access, ok)).toThrow(/declares no access rule/)
  })

  it('finds a route added to Express behind the table (the check the access test runs on the real app)', () => {
    const app = express()
    const table = new RouteTable()
    const r = table.router('/api/things')
    r.get('/', 'public', ok)
    r.router.get('/secret', ok) // no rule: straight on the Express router
    app.use(r.base, r.router)
    app.get(/.*/, ok) // the client's page fallback is not an API route
    expect(undeclaredRoutes(app, table)).toEqual(['get /secret'])
  })
})
