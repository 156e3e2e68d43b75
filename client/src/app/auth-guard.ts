import { createElement, lazy, Suspense, type ComponentType } from 'react'
import { redirect } from 'react-router-dom'
import type { Me } from '@kitwright/shared/auth'
import type { Role } from '@kitwright/shared/roles'
import { landingFor, paths } from '../config/paths'
import { meOptions } from '../features/auth/api/auth-queries'
import { queryClient } from './provider'
import { StartingUp } from './routes/root'

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

type PageModule = { Component: ComponentType }

/**
 * A route's `lazy` for a page behind sign-in. The router fetches the code of every route a URL
 * matches at once, alongside the loaders; for someone not signed in, whom the loader sends to the
 * sign-in page, that would be a download of pages they cannot open. So: once the signed-in user is
 * known (the same request the loader waits for), a signed-in user gets the page's module as usual;
 * otherwise the route gets a stand-in that fetches the page's code when it is first shown, after
 * sign-in.
 */
export function afterSignIn(load: () => Promise<PageModule>): () => Promise<PageModule> {
  return async () => {
    // Could not ask (the server is unreachable): load as usual; the loader shows the error.
    const signedIn = await queryClient.ensureQueryData(meOptions()).then((me) => me !== null, () => true)
    if (signedIn) return load()
    const Page = lazy(async () => ({ default: (await load()).Component }))
    return { Component: () => createElement(Suspense, { fallback: createElement(StartingUp) }, createElement(Page)) }
  }
}
