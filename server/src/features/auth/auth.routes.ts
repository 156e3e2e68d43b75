import { SignInSchema } from '@kitwright/shared/auth'
import type { Deps } from '../../deps'
import { clearSessionCookie, currentUser, setSessionCookie } from '../../lib/auth'
import type { RouteTable } from '../../lib/routes'
import { signIn } from './auth.service'

export function authRouter(deps: Deps, routes: RouteTable) {
  const r = routes.router('/api/auth')
  r.post('/sign-in', 'public', async (req, res) => {
    const input = SignInSchema.parse(req.body)
    const user = await signIn(deps.db, input, req.ip ?? 'unknown')
    await setSessionCookie(res, deps.tokens, user.id)
    res.json(user)
  })
  r.post('/sign-out', 'public', (_req, res) => {
    clearSessionCookie(res, deps.tokens)
    res.status(204).end()
  })
  r.get('/me', 'signed-in', (req, res) => {
    res.json(currentUser(req))
  })
  return r
}
