import type { PackItem } from '@kitwright/shared/pack'
import { Button } from '../../../components/ui/button'
import { cn } from '../../../lib/cn'
import { useTickItem, useUndoItem } from '../api/pack-queries'
import type { PackWaiting, ShownPackView } from '../api/pack-waiting'

const KIND_LABEL: Record<PackItem['kind'], string> = { unit: 'Unit', bag: 'Bag', pack: 'Pack' }

const clock = (iso: string) => new Date(iso).toLocaleTimeString([], { hour: '2-digit', minute: '2-digit' })

/** What this tablet did to the item and has not sent yet, in words (never read as the server's "Ticked by…"). */
function waitingWords(w: PackWaiting): { title: string; how: string } {
  const kept = 'kept on this tablet until the network is back'
  if (w.put === 'out') return { title: 'Out of the box — waiting to send', how: `You took it out at ${clock(w.at)}; ${kept}` }
  const how = w.method === 'scan' ? `${w.code ?? 'Its code'} scanned by you` : 'You ticked it'
  return { title: 'In the box — waiting to send', how: `${how} at ${clock(w.at)}; ${kept}` }
}

/**
 * Every item that must be in the box: confirmed (green, who and how), put in or taken out on this
 * tablet and not sent yet (amber, dashed), still to go, or held back with why.
 */
export function PackingList({ view, onError }: { view: ShownPackView; onError: (message: string) => void }) {
  const tick = useTickItem()
  const undo = useUndoItem()
  const open = view.shipment === null || view.shipment.status === 'packing'
  const orderId = view.order.id
  return (
    <ul aria-label="Packing list" className="space-y-2">
      {view.items.map((item) => {
        const back = view.backOrderedSerials.includes(item.serial)
        const waiting = item.waiting ? waitingWords(item.waiting) : null
        // What the box holds once what waits is sent: the tablet's word over the server's.
        const inBox = item.waiting ? item.waiting.put === 'in' : item.check !== null
        const act = (what: typeof tick, v: { orderId: string; item: PackItem }) => what.mutate(v, { onError: (e) => onError(e.message) })
        return (
          <li
            key={item.key}
            aria-label={`${KIND_LABEL[item.kind]} ${item.serial}${item.kind === 'bag' ? ' bag' : ''}`}
            className={cn(
              'flex flex-wrap items-center gap-3 rounded-lg border-2 p-3',
              waiting
                ? 'border-dashed border-amber-600 bg-amber-50'
                : item.check
                  ? 'border-green-700 bg-green-50'
                  : item.problem
                    ? 'border-red-700 bg-red-50'
                    : 'border-stone-300 bg-white',
              back && 'opacity-60',
            )}
          >
            <span aria-hidden className="w-10 text-center text-3xl">
              {waiting ? <span className="text-amber-700">{inBox ? '✔' : '↩'}</span> : item.check ? '✔' : item.problem ? '✖' : '☐'}
            </span>
            <div className="min-w-0 flex-1">
              <p className="text-xl font-bold">
                {KIND_LABEL[item.kind]} {item.serial}
                {item.binCode && item.kind === 'unit' ? <span className="ml-2 font-mono text-lg font-normal">({item.binCode})</span> : null}
              </p>
              <p className="text-lg">{item.description}</p>
              {item.problem && <p className="text-lg font-bold text-red-800">{item.problem}</p>}
              {waiting && (
                <>
                  <p className="text-lg font-bold text-amber-900">{waiting.title}</p>
                  <p className="text-base text-amber-900">{waiting.how}</p>
                </>
              )}
              {item.check && !waiting && (
                <p className="text-base text-green-900">
                  {item.check.method === 'scan' ? `Scanned ${item.check.code ?? ''}` : 'Ticked'} by {item.check.by.name}
                </p>
              )}
              {back && <p className="text-base font-bold">Back-ordered: follows in a later shipment</p>}
              {!inBox && !item.problem && item.kind === 'unit' && <p className="text-base text-stone-700">Scan its bin or serial</p>}
            </div>
            {open && inBox && (
              <Button size="bench" variant="secondary" onClick={() => act(undo, { orderId, item })}>
                Undo
              </Button>
            )}
            {open && !inBox && item.tickable && !item.problem && (
              <Button size="bench" onClick={() => act(tick, { orderId, item })}>
                In the box
              </Button>
            )}
          </li>
        )
      })}
    </ul>
  )
}
