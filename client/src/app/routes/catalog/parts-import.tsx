import { Link, useNavigate } from 'react-router-dom'
import { paths } from '../../../config/paths'
import { PartsImport } from '../../../features/parts/components/parts-import'

export function Component() {
  const navigate = useNavigate()
  return (
    <div className="space-y-6">
      <p>
        <Link to={paths.parts.href()} className="font-bold text-brand-700 hover:underline">
          ← Parts
        </Link>
      </p>
      <h1 className="text-3xl font-bold">Import parts from CSV</h1>
      <PartsImport onImported={() => void navigate(paths.parts.href())} />
    </div>
  )
}
