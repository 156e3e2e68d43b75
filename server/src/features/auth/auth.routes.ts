import { BenchPeopleQuerySchema, SignInSchema, type Session } from '@kitwright/shared/auth'
import type { Deps } from '../../deps'
import { auditContext, recordAudit } from '../../lib/audit'
import { HttpError } from '../../lib/http-errors'
import { clearSessionCookie, setSessionCookie } from '../../lib/auth'
import type { RouteTable } from '../../lib/routes'
import { benchPeople, signIn } from './auth.service'

export function authRouter(deps: Deps, routes: RouteTable) {
  const r = routes.router('/api/auth')
  r.post('/sign-in', 'public', async (req, res) => {
    const input = SignInSchema.parse(req.body)
    const how = 'pin' in input ? 'bench PIN' : 'password'
    const who = 'userId' in input ? input.userId : input.email
    let user
    try {
      user = await signIn(deps.db, input, req.ip ?? 'unknown')
    } catch (err) {
      if (err instanceof HttpError && (err.status === 401 || err.status === 429)) {
        await recordAudit(deps.db, auditContext(req), { action: 'auth.sign_in_refused', entityType: 'user', entityId: who, summary: `Sign-in refused for ${who} (${how}): ${err.message}` })
      }
      throw err
    }
    await setSessionCookie(res, deps.tokens, user.id)
    await recordAudit(deps.db, auditContext(req, user), { action: 'auth.sign_in', entityType: 'user', entityId: user.id, summary: `${user.name} signed in with a ${how}` })
    res.json(user)
  })
  // The bench tablet's sign-in screen: the names to pick from (display names only; nobody is signed in yet).
  r.get('/bench-people', 'public', async (req, res) => {
    res.json(await benchPeople(deps.db, BenchPeopleQuerySchema.parse(req.query).bench))
  })
  r.post('/sign-out', 'public', (_req, res) => {
    clearSessionCookie(res, deps.tokens)
    res.status(204).end()
  })
  // Public: asking who is signed in is how the app starts; nobody signed in is an answer, not an error.
  r.get('/me', 'public', (req, res) => {
    res.json({ user: req.user ?? null } satisfies Session)
  })
  return r
}
