import { useState } from 'react'
import type { BuildPage } from '@kitwright/shared/build'
import { formatDateOf } from '@kitwright/shared/dates'
import type { UnitLotNeed } from '@kitwright/shared/lots'
import { Button } from '../../../components/ui/button'
import { cn } from '../../../lib/cn'
import { useFitLot, useUndoLotFit } from '../api/build-queries'
import { formatWhen } from './format'

/**
 * One lot-tracked part of the unit: tap the lot field and scan the lot printed on its bag or box (the
 * field takes the scanner's typing and Enter; the bench scan field leaves a focused text field
 * alone), or tap one of the lots in stock, oldest first. Undo for a wrong scan.
 */
function LotNeedCard({ code, page, need }: { code: string; page: BuildPage; need: UnitLotNeed }) {
  const fit = useFitLot(code)
  const undo = useUndoLotFit(code)
  const [typed, setTyped] = useState('')
  const [problem, setProblem] = useState<string | null>(null)
  const done = need.left === 0
  const busy = page.workOrder.status === 'built'
  const send = (lotCode: string) => {
    if (lotCode.trim() === '') {
      setProblem(`Scan the lot on the ${need.name} bag or box, or tap a lot below`)
      return
    }
    setProblem(null)
    fit.mutate(
      { workOrderId: page.workOrder.id, partId: need.partId, lotCode: lotCode.trim() },
      { onSuccess: () => setTyped(''), onError: (err) => setProblem(err.message) },
    )
  }
  return (
    <li
      aria-label={`Lot of ${need.sku}`}
      data-done={done ? 'true' : undefined}
      className={cn('space-y-3 rounded-lg border-2 bg-white p-4', done ? 'border-brand-600 bg-brand-50' : 'border-amber-600')}
    >
      <p className="text-2xl">
        <strong>{need.name}</strong> <span className="text-stone-700">({need.sku})</span> · {need.quantity} in this unit
        {!done && <span className="ml-3 rounded-md bg-amber-200 px-2 py-0.5 text-lg font-bold text-amber-950">{need.left} still need a lot</span>}
      </p>
      {need.fitted.length > 0 && (
        <ul className="space-y-2">
          {need.fitted.map((f) => (
            <li key={f.id} className="flex flex-wrap items-center gap-4 text-xl">
              <span>
                Lot <strong className="font-mono">{f.lotCode}</strong> × {f.quantity} · {f.by.name}, {formatWhen(f.at)}
              </span>
              {!busy && (
                <Button
                  variant="secondary"
                  size="bench"
                  disabled={undo.isPending}
                  onClick={() => undo.mutate({ workOrderId: page.workOrder.id, fitId: f.id }, { onError: (err) => setProblem(err.message) })}
                >
                  Undo lot {f.lotCode}
                </Button>
              )}
            </li>
          ))}
        </ul>
      )}
      {!done && !busy && (
        <div className="space-y-3">
          <label className="block">
            <span className="block text-lg font-bold">Scan or type the lot on the bag or box</span>
            <span className="flex flex-wrap items-center gap-3">
              <input
                type="text"
                value={typed}
                onChange={(e) => {
                  setTyped(e.target.value)
                  setProblem(null)
                }}
                onKeyDown={(e) => {
                  if (e.key === 'Enter') {
                    e.preventDefault()
                    send(typed)
                  }
                }}
                aria-label={`Lot of ${need.sku}`}
                className="h-14 w-64 rounded-md border-2 border-stone-400 px-3 font-mono text-2xl focus:outline-3 focus:outline-brand-600"
              />
              <Button size="bench" disabled={fit.isPending} onClick={() => send(typed)}>
                Record lot
              </Button>
            </span>
          </label>
          {need.choices.length > 0 ? (
            <div className="space-y-2">
              <p className="text-lg font-bold">Or tap the lot you took (oldest first):</p>
              <div className="flex flex-wrap gap-3">
                {need.choices.map((c, i) => (
                  <Button
                    key={c.lotId}
                    variant={i === 0 ? 'primary' : 'secondary'}
                    size="bench"
                    disabled={fit.isPending}
                    onClick={() => send(c.code)}
                    aria-label={`Lot ${c.code}, ${c.free} free`}
                  >
                    <span className="font-mono">{c.code}</span>
                    <span className="text-base font-normal">
                      {c.free} free · received {formatDateOf(c.firstReceivedAt)}
                    </span>
                  </Button>
                ))}
              </div>
            </div>
          ) : (
            <p className="text-xl text-red-700">No lot of {need.sku} is in stock: ask the planner to receive one.</p>
          )}
        </div>
      )}
      {problem && (
        <p role="alert" className="rounded-md bg-red-50 p-3 text-xl font-bold text-red-800">
          {problem}
        </p>
      )}
    </li>
  )
}

/** The build bench asks which supplier's lot of each lot-tracked part went into the unit, so a recall can find it. */
export function LotPrompt({ code, page }: { code: string; page: BuildPage }) {
  return (
    <ul className="space-y-4">
      {page.lots.map((need) => (
        <LotNeedCard key={need.partId} code={code} page={page} need={need} />
      ))}
    </ul>
  )
}
