import { Link } from 'react-router-dom'
import { paths } from '../../config/paths'

export function NotFoundPage() {
  return (
    <div className="space-y-3">
      <h1 className="text-3xl font-bold">Page not found</h1>
      <p>There is no page at this address. Check the link, or start again from the menu.</p>
      <Link className="font-bold text-brand-700 underline" to={paths.home.href()}>
        Go to the start page
      </Link>
    </div>
  )
}
