import { useEffect } from 'react'
import { Outlet, useMatches } from 'react-router-dom'

/** What a route says about itself in its `handle`: the page's name, for the browser's tab. */
export type PageHandle = { title: string }

/** A route's handle naming its page: `handle: title('Orders')` → the tab reads "Orders · Kitwright". */
export function title(name: string): PageHandle {
  return { title: name }
}

/** The tab's text for a page name. */
export function documentTitle(name: string | undefined): string {
  return name ? `${name} · Kitwright` : 'Kitwright'
}

function pageName(handle: unknown): string | undefined {
  return typeof handle === 'object' && handle !== null && 'title' in handle && typeof handle.title === 'string' ? handle.title : undefined
}

/** The root of every page: names the browser tab after the deepest route that names itself. */
export function Root() {
  const matches = useMatches()
  const name = matches.map((m) => pageName(m.handle)).filter((n) => n !== undefined).at(-1)
  useEffect(() => {
    document.title = documentTitle(name)
  }, [name])
  return <Outlet />
}

/** Shown on a cold load while the first page's code and data arrive (the router's HydrateFallback). */
export function StartingUp() {
  return (
    <p role="status" className="p-8 text-lg text-stone-600">
      Opening Kitwright…
    </p>
  )
}
