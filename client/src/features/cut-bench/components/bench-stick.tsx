import { useState } from 'react'
import { toast } from 'sonner'
import type { CutRunDetail, CutStick } from '@kitwright/shared/cut-runs'
import { StickDrawing } from '../../../components/cut/stick-drawing'
import { Button } from '../../../components/ui/button'
import { useLengthUnit } from '../../../lib/shop-settings'
import { offcutLabelHref, useDamageStick, useTickCut, useUndoCut } from '../api/cut-bench-queries'

const time = (iso: string | null) => (iso ? new Date(iso).toLocaleTimeString([], { hour: '2-digit', minute: '2-digit' }) : '')

/** One stick at the saw: drawn large, every piece with one big tick and an undo, and the damaged-stick form. */
export function BenchStick({ run, stick, scale }: { run: CutRunDetail; stick: CutStick; scale: number }) {
  const { format } = useLengthUnit()
  const tick = useTickCut()
  const undo = useUndoCut()
  const damage = useDamageStick()
  const [damaging, setDamaging] = useState(false)
  const [reason, setReason] = useState('')
  const [spoiled, setSpoiled] = useState<Set<string>>(new Set())
  const binOf = new Map(run.workOrders.map((w) => [w.id, w.bin?.code ?? null]))
  const next = stick.cuts.find((c) => c.status === 'pending')
  const fail = (e: Error) => toast.error(e.message)
  const source = stick.source === 'offcut' ? `Take offcut ${stick.sourceOffcutCode} (${format(stick.length)}) from the rack` : `Take a ${format(stick.length)} stick of ${stick.partSku}`
  return (
    <section aria-label={`Stick ${stick.position}`} className="space-y-4 rounded-xl border-2 border-stone-300 bg-white p-4">
      <div className="flex flex-wrap items-baseline gap-3">
        <h2 className="text-3xl font-bold">Stick {stick.position}</h2>
        <span className="text-xl">{stick.status === 'pending' ? source : stick.status === 'damaged' ? `Damaged: ${stick.damagedReason}` : stick.status === 'done' ? 'All cut' : 'On the saw'}</span>
      </div>
      {stick.trim > 0 && stick.status === 'pending' && <p className="text-lg">Square the end first: trim {format(stick.trim)}.</p>}
      <StickDrawing stick={stick} kerf={run.kerf} scaleLength={scale} format={format} highlightCutId={next?.id} />
      <ol className="space-y-2">
        {stick.cuts.map((c, i) => (
          <li key={c.id} className={`flex flex-wrap items-center gap-3 rounded-lg border-2 p-3 ${c.status === 'cut' ? 'border-green-600 bg-green-50' : c.status === 'replanned' ? 'border-stone-200 bg-stone-100 text-stone-500' : c.id === next?.id ? 'border-amber-500 bg-amber-50' : 'border-stone-200'}`}>
            <span className="w-10 text-2xl font-bold">{i + 1}.</span>
            <span className="min-w-40 text-3xl font-bold">{format(c.length)}</span>
            <span className="min-w-0 flex-1 text-xl">
              {c.label} · WO <strong>{c.serial}</strong>
              {binOf.get(c.workOrderId) ? (
                <>
                  {' '}
                  → bin <strong>{binOf.get(c.workOrderId)}</strong>
                </>
              ) : null}
              {c.status === 'cut' && <span className="block text-base text-stone-600">Cut by {c.cutBy} at {time(c.cutAt)}</span>}
              {c.status === 'replanned' && <span className="block text-base">Moved to another stick</span>}
            </span>
            <span className="flex gap-2">
              {c.status === 'pending' && stick.status !== 'damaged' && (
                <Button size="bench" className="h-16 min-w-32 text-2xl" aria-label={`Tick ${format(c.length)} for WO ${c.serial}`} disabled={tick.isPending} onClick={() => tick.mutate({ runId: run.id, cutId: c.id }, { onError: fail })}>
                  ✓ Cut
                </Button>
              )}
              {c.status === 'cut' && stick.status !== 'damaged' && (
                <Button size="bench" variant="secondary" aria-label={`Undo ${format(c.length)} for WO ${c.serial}`} disabled={undo.isPending} onClick={() => undo.mutate({ runId: run.id, cutId: c.id }, { onError: fail })}>
                  Undo
                </Button>
              )}
            </span>
          </li>
        ))}
      </ol>
      {stick.offcutId && (
        <p className="flex flex-wrap items-center gap-3 rounded-lg bg-green-100 p-3 text-xl">
          Offcut {format(stick.remnant)} goes to the rack as {stick.offcutCode}.
          <a className="inline-flex h-14 items-center rounded-md bg-brand-700 px-5 font-bold text-white" href={offcutLabelHref(run.id, stick.id)} target="_blank" rel="noreferrer">
            Print its label
          </a>
        </p>
      )}
      {stick.status !== 'damaged' && stick.status !== 'done' && !damaging && (
        <Button size="bench" variant="secondary" onClick={() => setDamaging(true)}>
          Stick damaged or miscut…
        </Button>
      )}
      {damaging && (
        <form
          aria-label="Damaged stick"
          className="space-y-3 rounded-lg border-2 border-red-600 p-3"
          onSubmit={(e) => {
            e.preventDefault()
            damage.mutate(
              { runId: run.id, stickId: stick.id, reason, spoiledCutIds: [...spoiled] },
              { onSuccess: () => { setDamaging(false); toast.success('The pieces were planned on other sticks') }, onError: fail },
            )
          }}
        >
          <label className="block text-lg font-bold">
            What happened?
            <input value={reason} onChange={(e) => setReason(e.target.value)} className="mt-1 h-14 w-full rounded-md border-2 border-stone-400 px-3 text-xl" placeholder="e.g. cracked end, miscut" />
          </label>
          {stick.cuts.some((c) => c.status === 'cut') && <p className="text-lg">Pieces already cut that are spoiled too:</p>}
          {stick.cuts
            .filter((c) => c.status === 'cut')
            .map((c) => (
              <label key={c.id} className="flex min-h-12 items-center gap-3 text-xl">
                <input type="checkbox" className="size-7" checked={spoiled.has(c.id)} onChange={(e) => { const s = new Set(spoiled); if (e.target.checked) s.add(c.id); else s.delete(c.id); setSpoiled(s) }} />
                {format(c.length)} for WO {c.serial}
              </label>
            ))}
          <div className="flex gap-3">
            <Button type="submit" size="bench" variant="danger" disabled={damage.isPending || reason.trim() === ''}>
              {damage.isPending ? 'Re-planning…' : 'Scrap it and re-plan its pieces'}
            </Button>
            <Button size="bench" variant="secondary" onClick={() => setDamaging(false)}>
              Back
            </Button>
          </div>
        </form>
      )}
    </section>
  )
}
