import { isRouteErrorResponse, Link, useRouteError } from 'react-router-dom'
import { paths } from '../../config/paths'
import { ApiError } from '../../lib/api-client'

/** Shown when a page fails to load or render: says what happened and offers a way on. */
export function RouteErrorBoundary() {
  const error = useRouteError()
  const message =
    error instanceof ApiError
      ? error.message
      : isRouteErrorResponse(error)
        ? `${error.status} ${error.statusText}`
        : 'This page failed to load. Reload it; if it keeps failing, tell the owner what you were doing.'
  return (
    <div role="alert" className="mx-auto max-w-xl space-y-4 p-8">
      <h1 className="text-3xl font-bold">Something went wrong</h1>
      <p className="text-lg">{message}</p>
      <div className="flex gap-4">
        <button type="button" className="font-bold text-brand-700 underline" onClick={() => window.location.reload()}>
          Reload
        </button>
        <Link className="font-bold text-brand-700 underline" to={paths.home.href()}>
          Go to the start page
        </Link>
      </div>
    </div>
  )
}
