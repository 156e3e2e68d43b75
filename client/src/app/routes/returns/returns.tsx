import { useQuery } from '@tanstack/react-query'
import { useState } from 'react'
import { useNavigate } from 'react-router-dom'
import { formatDateOf } from '@kitwright/shared/dates'
import type { ReturnLookup } from '@kitwright/shared/returns'
import { Button } from '../../../components/ui/button'
import { ScanField } from '../../../components/ui/scan-field'
import { Section } from '../../../components/ui/section'
import { paths } from '../../../config/paths'
import { meOptions } from '../../../features/auth/api/auth-queries'
import { returnsListOptions, useLookupReturnable, useReceiveReturn } from '../../../features/returns/api/return-queries'
import { OpenReturnForm } from '../../../features/returns/components/open-return-form'
import { ReturnsTable } from '../../../features/returns/components/returns-table'

type Mode = 'open' | 'receive'

/**
 * Returns by serial. The office scans (or types) a serial or an order number to open a return; the
 * pack bench scans the return label's barcode (or the serial) to receive the parcel. One scan field,
 * so a wedge scanner always types into the right place.
 */
export function Component() {
  const { data: me } = useQuery(meOptions())
  const office = me?.role === 'admin' || me?.role === 'planner'
  const receiver = office || me?.role === 'packer'
  const [mode, setMode] = useState<Mode>(office ? 'open' : 'receive')
  const [filter, setFilter] = useState<'undecided' | 'all'>('undecided')
  const list = useQuery(returnsListOptions(filter))
  const lookup = useLookupReturnable()
  const receive = useReceiveReturn()
  const navigate = useNavigate()
  const [found, setFound] = useState<ReturnLookup | null>(null)
  const [received, setReceived] = useState<string | null>(null)

  // A refused scan is said by the scan field itself (code and message), once.
  const onScan = async (code: string) => {
    setReceived(null)
    if (mode === 'open') {
      setFound(null)
      setFound(await lookup.mutateAsync(code))
    } else {
      const r = await receive.mutateAsync(code)
      setReceived(`${r.number}: unit ${r.unit.serial} (${r.unit.kitSku}) received back. ${office ? 'Decide it below.' : 'Set it on the returns shelf for the office to decide.'}`)
    }
  }

  return (
    <div className="max-w-5xl space-y-6">
      <h1 className="text-4xl font-bold">Returns</h1>
      {office && receiver && (
        <div role="group" aria-label="What the scan does" className="flex flex-wrap gap-3">
          <Button size="bench" variant={mode === 'open' ? 'primary' : 'secondary'} aria-pressed={mode === 'open'} onClick={() => setMode('open')}>
            Open a return
          </Button>
          <Button size="bench" variant={mode === 'receive' ? 'primary' : 'secondary'} aria-pressed={mode === 'receive'} onClick={() => setMode('receive')}>
            Receive a parcel
          </Button>
        </div>
      )}
      <ScanField label={mode === 'open' ? 'Serial or order number of the unit coming back' : 'Return label or serial of the parcel that came in'} onScan={onScan} />
      {received && (
        <p role="status" className="rounded-lg border-2 border-green-600 bg-green-50 p-4 text-xl text-green-900">
          {received}
        </p>
      )}
      {mode === 'open' && found && (
        <Section title={`Shipped units of ${found.code}`}>
          <ul className="space-y-4" aria-label="Units that can be returned">
            {found.units.map((u) => (
              <li key={u.workOrderId} aria-label={`Unit ${u.serial}`} className="space-y-3 rounded-md border border-stone-300 p-4">
                <p className="text-xl">
                  <strong>{u.serial}</strong> · {u.kitName} ({u.kitSku} rev {u.revisionCode}) · order {u.orderNumber}
                  {u.shippedAt ? ` · shipped ${formatDateOf(u.shippedAt)}` : ''}
                </p>
                {u.openReturnId ? (
                  <Button size="bench" variant="secondary" onClick={() => void navigate(paths.returnDetail.href(u.openReturnId!))}>
                    Open return {u.openReturnNumber}
                  </Button>
                ) : (
                  <OpenReturnForm unit={u} onOpened={(id) => void navigate(paths.returnDetail.href(id))} />
                )}
              </li>
            ))}
          </ul>
        </Section>
      )}
      <Section
        title="Returns"
        actions={
          <div className="flex gap-2">
            <Button className="h-12" variant={filter === 'undecided' ? 'primary' : 'secondary'} onClick={() => setFilter('undecided')}>
              To decide
            </Button>
            <Button className="h-12" variant={filter === 'all' ? 'primary' : 'secondary'} onClick={() => setFilter('all')}>
              All
            </Button>
          </div>
        }
      >
        {list.isError && <p role="alert">{list.error.message}</p>}
        {list.data && <ReturnsTable rows={list.data.returns} hrefOf={paths.returnDetail.href} />}
      </Section>
    </div>
  )
}
