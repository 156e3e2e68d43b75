import { useQuery } from '@tanstack/react-query'
import { useEffect, useRef, useState } from 'react'
import { useSearchParams } from 'react-router-dom'
import type { ShipResult } from '@kitwright/shared/pack'
import { ORDER_STAGE_LABELS } from '@kitwright/shared/status-words'
import { Button } from '../../../components/ui/button'
import { ScanField } from '../../../components/ui/scan-field'
import { Caution } from '../../../components/ui/section'
import { meOptions } from '../../../features/auth/api/auth-queries'
import { packOrderOptions, useLookup, useScanItem } from '../../../features/pack-bench/api/pack-queries'
import { PACK_ACTIONS, overlayWaiting } from '../../../features/pack-bench/api/pack-waiting'
import { useWaitingActions } from '../../../lib/offline/use-bench-queue'
import { BagWeighing } from '../../../features/pack-bench/bag-weighing/bag-weighing'
import { BuyingPanel } from '../../../features/pack-bench/components/buying-panel'
import { LabelledPanel } from '../../../features/pack-bench/components/labelled-panel'
import { OrderHeader } from '../../../features/pack-bench/components/order-header'
import { PackingList } from '../../../features/pack-bench/components/packing-list'
import { ParcelsPanel } from '../../../features/pack-bench/components/parcels-panel'
import { PartialApproval } from '../../../features/pack-bench/components/partial-approval'
import { PrintLinks } from '../../../features/pack-bench/components/print-links'
import { ShippedPanel } from '../../../features/pack-bench/components/shipped-panel'
import { packWorklistOptions } from '../../../features/pack-bench/api/pack-worklist-queries'
import { BenchDeviceToggle } from '../../../components/ui/bench-device-toggle'
import { Worklist } from '../../../components/ui/worklist'

export function Component() {
  const [params, setParams] = useSearchParams()
  const orderId = params.get('order')
  const me = useQuery(meOptions())
  const order = useQuery({ ...packOrderOptions(orderId ?? ''), enabled: orderId !== null })
  const lookup = useLookup()
  const worklist = useQuery({ ...packWorklistOptions(), enabled: orderId === null })
  const scanItem = useScanItem()
  const [problem, setProblem] = useState<string | null>(null)
  const [shipped, setShipped] = useState<ShipResult | null>(null)
  // Items scanned, ticked or undone on this tablet with no network show as waiting until the server has them.
  const waiting = useWaitingActions(PACK_ACTIONS)
  const view = orderId && order.data ? overlayWaiting(order.data, waiting) : undefined
  const office = me.data?.role === 'admin' || me.data?.role === 'planner'
  // A problem shown stays until the view changes (an action went through) or the next scan.
  useEffect(() => setProblem(null), [order.dataUpdatedAt])

  // What the next scan goes to, kept current between queued scans (a scan may open an order).
  const opened = useRef<{ orderId: string | null; shipped: boolean }>({ orderId: null, shipped: false })
  const openId = view ? view.order.id : null
  useEffect(() => {
    opened.current = { orderId: openId, shipped: shipped !== null }
  }, [openId, shipped])

  async function onScan(code: string) {
    setProblem(null)
    const now = opened.current
    try {
      if (now.orderId && !now.shipped) {
        await scanItem.mutateAsync({ orderId: now.orderId, code })
        return
      }
      const v = await lookup.mutateAsync(code)
      opened.current = { orderId: v.order.id, shipped: false }
      setShipped(null)
      setParams({ order: v.order.id })
      // The scan that opened the order also puts its unit in the box, when it may go.
      const item = v.items.find((i) => i.binCode === code.toUpperCase() || (i.serial === code.toUpperCase() && i.kind !== 'bag'))
      if (item && !item.check && !item.problem) await scanItem.mutateAsync({ orderId: v.order.id, code })
    } catch (e) {
      setProblem(e instanceof Error ? e.message : String(e))
    }
  }

  const packing = view && (view.shipment === null || view.shipment.status === 'packing')
  return (
    <div className="space-y-4 text-lg">
      <div className="flex flex-wrap items-center justify-between gap-3">
        <h1 className="text-4xl font-bold">Pack bench</h1>
        <BenchDeviceToggle bench="pack" />
      </div>
      <ScanField label={view && !shipped ? `Scan each unit's bin or serial for order ${view.order.number}` : 'Scan a bin or serial to open its order'} onScan={onScan} />
      {problem && (
        <p role="alert" className="rounded-lg border-4 border-red-700 bg-red-50 p-4 text-2xl font-bold text-red-900">
          {problem}
        </p>
      )}
      {shipped && (
        <div role="status" className="space-y-2 rounded-lg border-4 border-green-700 bg-green-50 p-4 text-2xl">
          <p className="font-bold">
            Order {shipped.view.order.number} shipped · tracking <span className="font-mono">{shipped.view.shipment?.trackingNumber}</span>
          </p>
          <p>{shipped.mailQueued ? `The shipped e-mail is queued to ${shipped.view.order.customerName}.` : 'The shipped e-mail was already sent.'}</p>
          {shipped.view.backOrderedSerials.length + shipped.view.items.length > 0 && <p>Still to ship later: {[...new Set(shipped.view.items.map((i) => i.serial))].join(', ')}</p>}
          <Button
            size="bench"
            onClick={() => {
              setShipped(null)
              setParams({})
            }}
          >
            Next order
          </Button>
        </div>
      )}
      {!orderId && !shipped && (
        <>
          <p className="text-2xl text-stone-700">Scan the bin of a unit that passed its leak test, or type a serial, or pick the order below.</p>
          {worklist.isError && <p role="alert" className="text-xl text-red-700">{worklist.error.message}</p>}
          <Worklist
            label={ORDER_STAGE_LABELS.ready_to_pack}
            items={worklist.data}
            empty="No unit is built and waiting: the build bench sends them here."
            itemKey={(o) => o.orderId}
            itemLabel={(o) => `Order ${o.orderNumber}`}
            onPick={(o) => {
              setProblem(null)
              setParams({ order: o.orderId })
            }}
          >
            {(o) => (
              <>
                <strong>Order {o.orderNumber}</strong> · {o.customerName} ({o.shipCountry}) · {o.ready.length} of {o.unitsToShip} unit{o.unitsToShip === 1 ? '' : 's'} ready:{' '}
                {o.ready.map((u) => (u.binCode ? `${u.serial} in ${u.binCode}` : u.serial)).join(', ')}
              </>
            )}
          </Worklist>
        </>
      )}
      {order.isError && <p role="alert" className="text-xl text-red-700">{order.error.message}</p>}
      {view && !shipped && (
        <>
          <OrderHeader view={view} />
          {packing && view.blockers.length > 0 && (
            <div aria-label="Before the label" className="rounded-lg border-2 border-amber-600 bg-amber-50 p-3">
              <p className="text-xl font-bold">Before the label can be bought:</p>
              <ul className="list-disc pl-6">
                {view.blockers.map((b) => (
                  <li key={b}>{b}</li>
                ))}
              </ul>
            </div>
          )}
          <PackingList view={view} onError={setProblem} />
          <BagWeighing orderId={view.order.id} open={Boolean(packing)} />
          {office && packing && view.shipment && !view.canLabel && <PartialApproval view={view} onError={setProblem} />}
          {!office && view.shipment?.partialApproval && <p className="text-lg">Partial shipment approved by {view.shipment.partialApproval.by.name}: {view.shipment.partialApproval.note}</p>}
          <PrintLinks view={view} />
          <Caution>The slip carries the customer's care and safety sheet (fill line, ground-fault protected outlet, drip loop): put it in the box on top.</Caution>
          {packing && view.canLabel && <ParcelsPanel key={`${view.shipment?.id}-${view.shippingSerials.join()}`} view={view} onError={setProblem} />}
          {view.shipment?.status === 'buying' && <BuyingPanel view={view} onError={setProblem} />}
          {view.shipped.length > 0 && <ShippedPanel view={view} office={office} onError={setProblem} />}
          {view.shipment?.status === 'labelled' && <LabelledPanel view={view} onShipped={(r) => { setProblem(null); setShipped(r) }} onError={setProblem} />}
        </>
      )}
    </div>
  )
}
