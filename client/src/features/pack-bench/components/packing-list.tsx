import type { PackItem, PackView } from '@kitwright/shared/pack'
import { Button } from '../../../components/ui/button'
import { cn } from '../../../lib/cn'
import { useTickItem, useUndoItem } from '../api/pack-queries'

const KIND_LABEL: Record<PackItem['kind'], string> = { unit: 'Unit', bag: 'Bag', pack: 'Pack' }

/** Every item that must be in the box: confirmed (green, who and how), waiting, or held back with why. */
export function PackingList({ view, onError }: { view: PackView; onError: (message: string) => void }) {
  const tick = useTickItem()
  const undo = useUndoItem()
  const open = view.shipment === null || view.shipment.status === 'packing'
  const orderId = view.order.id
  return (
    <ul aria-label="Packing list" className="space-y-2">
      {view.items.map((item) => {
        const back = view.backOrderedSerials.includes(item.serial)
        return (
          <li
            key={item.key}
            aria-label={`${KIND_LABEL[item.kind]} ${item.serial}${item.kind === 'bag' ? ' bag' : ''}`}
            className={cn(
              'flex flex-wrap items-center gap-3 rounded-lg border-2 p-3',
              item.check ? 'border-green-700 bg-green-50' : item.problem ? 'border-red-700 bg-red-50' : 'border-stone-300 bg-white',
              back && 'opacity-60',
            )}
          >
            <span aria-hidden className="w-10 text-center text-3xl">
              {item.check ? '✔' : item.problem ? '✖' : '☐'}
            </span>
            <div className="min-w-0 flex-1">
              <p className="text-xl font-bold">
                {KIND_LABEL[item.kind]} {item.serial}
                {item.binCode && item.kind === 'unit' ? <span className="ml-2 font-mono text-lg font-normal">({item.binCode})</span> : null}
              </p>
              <p className="text-lg">{item.description}</p>
              {item.problem && <p className="text-lg font-bold text-red-800">{item.problem}</p>}
              {item.check && (
                <p className="text-base text-green-900">
                  {item.check.method === 'scan' ? `Scanned ${item.check.code ?? ''}` : 'Ticked'} by {item.check.by.name}
                </p>
              )}
              {back && <p className="text-base font-bold">Back-ordered: follows in a later shipment</p>}
              {!item.check && !item.problem && item.kind === 'unit' && <p className="text-base text-stone-700">Scan its bin or serial</p>}
            </div>
            {open && item.check && (
              <Button size="bench" variant="secondary" onClick={() => undo.mutate({ orderId, itemKey: item.key }, { onError: (e) => onError(e.message) })}>
                Undo
              </Button>
            )}
            {open && !item.check && item.tickable && !item.problem && (
              <Button size="bench" onClick={() => tick.mutate({ orderId, itemKey: item.key }, { onError: (e) => onError(e.message) })}>
                In the box
              </Button>
            )}
          </li>
        )
      })}
    </ul>
  )
}
