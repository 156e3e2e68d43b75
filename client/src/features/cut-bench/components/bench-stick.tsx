import { useEffect, useRef, useState } from 'react'
import { toast } from 'sonner'
import type { Cut, CutRunDetail, CutStick } from '@kitwright/shared/cut-runs'
import { foldRuns, runNumbers, samePieceRow, type PieceRun } from '@kitwright/shared/domain/saw-order'
import { StickDrawing } from '../../../components/cut/stick-drawing'
import { StickLegend } from '../../../components/cut/stick-legend'
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
  // Equal pieces one after another fold into one row; a row still takes one tick per piece.
  const rows = foldRuns(stick.cuts, samePieceRow)
  const live = stick.cuts.filter((c) => c.status !== 'replanned')
  const cutCount = live.filter((c) => c.status === 'cut').length
  // Taps on "Cut one" queue up (one entry per tap, by row) and are sent one at a time, so quick taps
  // with gloves are never lost and each records exactly one piece.
  const [queue, setQueue] = useState<string[]>([])
  const sending = useRef(false)
  useEffect(() => {
    if (sending.current || queue.length === 0) return
    const [key, ...rest] = queue
    const row = rows.find((r) => r.items[0]!.id === key)
    const cut = row?.items.find((c) => c.status === 'pending')
    if (!cut || stick.status === 'damaged') {
      setQueue(rest)
      return
    }
    sending.current = true
    tick.mutate(
      { runId: run.id, cutId: cut.id, what: `${format(cut.length)} ${cut.label} for WO ${cut.serial} (stick ${stick.position})` },
      {
        onError: fail,
        onSettled: (_data, error) => {
          sending.current = false
          setQueue((q) => (error ? [] : q.slice(1)))
        },
      },
    )
  })
  const source =
    stick.source === 'offcut'
      ? `Take offcut ${stick.sourceOffcutCode} (${format(stick.length)}) from the rack`
      : `Take a ${format(stick.length)} stick of ${stick.partSku}`
  return (
    <section aria-label={`Stick ${stick.position}`} className="space-y-4 rounded-xl border-2 border-stone-300 bg-white p-4">
      <div className="flex flex-wrap items-baseline gap-3">
        <h2 className="text-3xl font-bold">Stick {stick.position}</h2>
        <span className="text-xl">
          {stick.status === 'pending'
            ? source
            : stick.status === 'damaged'
              ? `Damaged: ${stick.damagedReason}`
              : stick.status === 'done'
                ? 'All cut'
                : 'On the saw'}
        </span>
      </div>
      <p className="text-xl">
        <strong>{cutCount}</strong> of {live.length} pieces cut
      </p>
      {stick.trim > 0 && stick.status === 'pending' && <p className="text-lg">Square the end first: trim {format(stick.trim)}.</p>}
      <StickDrawing stick={stick} kerf={run.kerf} scaleLength={scale} format={format} highlightCutId={next?.id} />
      <StickLegend bench className="text-base" />
      <ol className="space-y-2" aria-label="Pieces in saw order">
        {rows.map((r) => (
          <PieceRow
            key={r.items[0]!.id}
            stick={stick}
            row={r}
            bin={binOf.get(r.items[0]!.workOrderId) ?? null}
            next={next?.id}
            queued={queue.filter((k) => k === r.items[0]!.id).length}
            onTick={() => setQueue((q) => [...q, r.items[0]!.id])}
            onUndo={(cutId) =>
              undo.mutate(
                { runId: run.id, cutId, what: `${format(r.items[0]!.length)} ${r.items[0]!.label} for WO ${r.items[0]!.serial} (stick ${stick.position})` },
                { onError: fail },
              )
            }
            busy={tick.isPending || undo.isPending || queue.length > 0}
          />
        ))}
      </ol>
      {stick.offcutId && (
        <p className="flex flex-wrap items-center gap-3 rounded-lg border-2 border-dashed border-stick-offcut-edge bg-stick-offcut p-3 text-xl">
          Offcut {format(stick.remnant)} goes to the rack as {stick.offcutCode}.
          <a
            className="inline-flex h-14 items-center rounded-md bg-brand-700 px-5 font-bold text-white"
            href={offcutLabelHref(run.id, stick.id)}
            target="_blank"
            rel="noreferrer"
          >
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
              {
                onSuccess: () => {
                  setDamaging(false)
                  toast.success('The pieces were planned on other sticks')
                },
                onError: fail,
              },
            )
          }}
        >
          <label className="block text-lg font-bold">
            What happened?
            <input
              value={reason}
              onChange={(e) => setReason(e.target.value)}
              className="mt-1 h-14 w-full rounded-md border-2 border-stone-400 px-3 text-xl"
              placeholder="e.g. cracked end, miscut"
            />
          </label>
          {stick.cuts.some((c) => c.status === 'cut') && <p className="text-lg">Pieces already cut that are spoiled too:</p>}
          {rows.map((r) => {
            // One line per row of equal pieces: how many of its cut pieces are spoiled (the last ones cut).
            const cut = r.items.filter((c) => c.status === 'cut')
            if (cut.length === 0) return null
            const n = cut.filter((c) => spoiled.has(c.id)).length
            const set = (k: number) => {
              const s = new Set(spoiled)
              cut.forEach((c, i) => (i >= cut.length - k ? s.add(c.id) : s.delete(c.id)))
              setSpoiled(s)
            }
            return (
              <div key={r.items[0]!.id} className="flex min-h-14 flex-wrap items-center gap-3 text-xl">
                <span className="min-w-0 flex-1">
                  {runNumbers(r)}. {format(r.items[0]!.length)} for WO {r.items[0]!.serial} ({cut.length} cut)
                </span>
                <Button
                  size="bench"
                  variant="secondary"
                  aria-label={`One spoiled piece fewer of ${runNumbers(r)}`}
                  disabled={n === 0}
                  onClick={() => set(n - 1)}
                >
                  −
                </Button>
                <span className="min-w-24 text-center font-bold" aria-live="polite">
                  {n} spoiled
                </span>
                <Button
                  size="bench"
                  variant="secondary"
                  aria-label={`One spoiled piece more of ${runNumbers(r)}`}
                  disabled={n >= cut.length}
                  onClick={() => set(n + 1)}
                >
                  +
                </Button>
              </div>
            )
          })}
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

/**
 * One row of the cut list: a run of equal pieces for one unit ("10 × 3-5/16\"") with its progress,
 * a big "Cut one" that records one piece per tap, and an undo of the last piece ticked.
 */
function PieceRow({
  stick,
  row,
  bin,
  next,
  queued,
  onTick,
  onUndo,
  busy,
}: {
  stick: CutStick
  row: PieceRun<Cut>
  bin: string | null
  next: string | undefined
  queued: number
  onTick: () => void
  onUndo: (cutId: string) => void
  busy: boolean
}) {
  const { format } = useLengthUnit()
  const first = row.items[0]!
  const pieces = row.items.filter((c) => c.status !== 'replanned')
  const done = pieces.filter((c) => c.status === 'cut')
  const shown = Math.min(pieces.length, done.length + queued)
  const last = done.reduce<Cut | undefined>((a, c) => (!a || (c.cutAt ?? '') >= (a.cutAt ?? '') ? c : a), undefined)
  const moved = pieces.length === 0
  const complete = !moved && done.length === pieces.length
  const open = stick.status !== 'damaged'
  const what = `${pieces.length > 1 ? `${pieces.length} × ` : ''}${format(first.length)}`
  const isNext = row.items.some((c) => c.id === next)
  return (
    <li
      aria-label={`${runNumbers(row)}: ${what} ${first.label} for WO ${first.serial}`}
      className={`space-y-2 rounded-lg border-2 p-3 ${moved ? 'border-stone-200 bg-stone-100 text-stone-500' : complete ? 'border-brand-600 bg-brand-50' : isNext ? 'border-brand-900 border-4 bg-white' : 'border-stone-300 bg-white'}`}
    >
      <div className="flex flex-wrap items-baseline gap-x-4 gap-y-1">
        <span className="min-w-16 text-2xl font-bold">{runNumbers(row)}.</span>
        <span className="text-3xl font-bold">{what}</span>
        <span className="min-w-0 flex-1 text-xl">
          {first.label} · WO <strong>{first.serial}</strong>
          {bin ? (
            <>
              {' '}
              → bin <strong>{bin}</strong>
            </>
          ) : null}
        </span>
      </div>
      {moved ? (
        <p className="text-base">Moved to another stick</p>
      ) : (
        <div className="flex flex-wrap items-center gap-3">
          <div className="flex min-w-40 flex-1 items-center gap-3">
            <div
              role="progressbar"
              aria-label={`Pieces cut of ${runNumbers(row)}`}
              aria-valuemin={0}
              aria-valuemax={pieces.length}
              aria-valuenow={done.length}
              className="h-5 flex-1 overflow-hidden rounded-full border-2 border-stone-400 bg-white"
            >
              <div className="h-full bg-brand-600" style={{ width: `${(shown / pieces.length) * 100}%` }} />
            </div>
            <span className="text-2xl font-bold tabular-nums">
              {done.length}/{pieces.length}
            </span>
            {queued > 0 && <span className="text-base text-stone-600">+{queued} saving…</span>}
          </div>
          {open && !complete && (
            <Button
              size="bench"
              className="h-16 min-w-36 text-2xl"
              aria-label={`Tick one ${format(first.length)} for WO ${first.serial}`}
              disabled={shown >= pieces.length}
              onClick={onTick}
            >
              ✓ Cut one
            </Button>
          )}
          {open && done.length > 0 && (
            <Button
              size="bench"
              variant="secondary"
              className="h-16"
              aria-label={`Undo one ${format(first.length)} for WO ${first.serial}`}
              disabled={busy}
              onClick={() => last && onUndo(last.id)}
            >
              Undo
            </Button>
          )}
        </div>
      )}
      {last && (
        <p className="text-base text-stone-600">
          Last cut by {last.cutBy} at {time(last.cutAt)}
        </p>
      )}
    </li>
  )
}
