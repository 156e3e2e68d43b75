import { useQuery } from '@tanstack/react-query'
import { useNavigate, useParams } from 'react-router-dom'
import { ScanField } from '../../../components/ui/scan-field'
import { paths } from '../../../config/paths'
import { unitRecordOptions } from '../../../features/build-bench/api/build-queries'
import { BuildRecord } from '../../../features/build-bench/components/build-record'
import { meOptions } from '../../../features/auth/api/auth-queries'
import { UnitReturns } from '../../../features/returns/components/unit-returns'

/** The build record of one serial; scanning another serial here opens its record. */
export function Component() {
  const { serial = '' } = useParams()
  const navigate = useNavigate()
  const record = useQuery(unitRecordOptions(serial))
  const { data: me } = useQuery(meOptions())
  const readsReturns = me?.role === 'admin' || me?.role === 'planner' || me?.role === 'packer'
  return (
    <div className="space-y-6">
      <ScanField label="Scan or type a serial to open its build record" className="max-w-xl print:hidden" onScan={(code) => void navigate(paths.unit.href(code.toUpperCase()))} />
      {record.isError && (
        <p role="alert" className="text-2xl text-red-700">
          {record.error.message}
        </p>
      )}
      {record.isPending && <p className="text-xl">Loading the build record of {serial}…</p>}
      {record.data && <BuildRecord record={record.data} />}
      {record.data && <UnitReturns serial={record.data.workOrder.serial} returnHref={readsReturns ? paths.returnDetail.href : null} />}
    </div>
  )
}
