import { redirect } from 'react-router-dom'
import type { Me } from '@kitwright/shared/auth'
import type { Role } from '@kitwright/shared/roles'
import { landingFor, paths } from '../config/paths'
import { meOptions } from '../features/auth/api/auth-queries'
import { queryClient } from './provider'

/** Loader helper: the signed-in user, or a redirect to sign-in that comes back here afterwards. */
export async function requireUser(request: Request): Promise<Me> {
  const me = await queryClient.ensureQueryData(meOptions())
  if (!me) {
    const url = new URL(request.url)
    throw redirect(paths.signIn.href(url.pathname + url.search))
  }
  return me
}

/** Loader helper: sends a user whose role may not open this page to their own landing page. */
export async function requireRole(request: Request, roles: readonly Role[]): Promise<Me> {
  const me = await requireUser(request)
  if (!roles.includes(me.role)) throw redirect(landingFor(me.role))
  return me
}
