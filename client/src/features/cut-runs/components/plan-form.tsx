import { useQuery } from '@tanstack/react-query'
import { useEffect, useMemo, useState } from 'react'
import type { CandidateQuery, CutRunDetail, PlanCutRunInput } from '@kitwright/shared/cut-runs'
import { Button } from '../../../components/ui/button'
import { Field, Input, Select } from '../../../components/ui/field'
import { Section } from '../../../components/ui/section'
import { ApiError } from '../../../lib/api-client'
import { shopSettingsOptions, useLengthUnit } from '../../../lib/shop-settings'
import { candidatesOptions, pipeStockOptions, usePlanCutRun } from '../api/cut-run-queries'
import { PlanProgress } from './plan-progress'

type Mode = 'all' | 'due' | 'kit'
type StockChoice = Record<string, { use: boolean; max: number }>

/** Choose work orders, stock and the saw's settings, and run the engine. */
export function PlanForm({ onPlanned }: { onPlanned: (run: CutRunDetail) => void }) {
  const { format, formatInput, parse } = useLengthUnit()
  const settings = useQuery(shopSettingsOptions())
  const [mode, setMode] = useState<Mode>('all')
  const [dueBy, setDueBy] = useState('')
  const [kitId, setKitId] = useState('')
  const query: CandidateQuery = mode === 'due' && dueBy ? { dueBy } : mode === 'kit' && kitId ? { kitId } : {}
  const all = useQuery(candidatesOptions({}))
  const candidates = useQuery(candidatesOptions(query))
  const stock = useQuery(pipeStockOptions())
  const [unselected, setUnselected] = useState<Set<string>>(new Set())
  const [choice, setChoice] = useState<StockChoice>({})
  const [useOffcuts, setUseOffcuts] = useState(true)
  const [saw, setSaw] = useState<{ kerf: string; endTrim: string; minOffcut: string } | null>(null)
  // The shop's planning time until the planner types another.
  const [typedSeconds, setSeconds] = useState<number | null>(null)
  const seconds = typedSeconds ?? settings.data?.nestingTimeLimitSeconds ?? 2
  const plan = usePlanCutRun()

  useEffect(() => {
    if (settings.data && !saw) setSaw({ kerf: formatInput(settings.data.kerf), endTrim: formatInput(settings.data.endTrim), minOffcut: formatInput(settings.data.minOffcut) })
  }, [settings.data, saw, formatInput])

  const kits = useMemo(() => [...new Map((all.data ?? []).map((w) => [w.kitId, `${w.kitSku} ${w.kitName}`])).entries()], [all.data])
  const chosen = (candidates.data ?? []).filter((w) => !unselected.has(w.id))
  const key = (partId: string, length: number) => `${partId}|${length}`
  const parsed = saw ? { kerf: parse(saw.kerf), endTrim: parse(saw.endTrim), minOffcut: parse(saw.minOffcut) } : null
  const sawError = parsed && Object.values(parsed).find((p) => !p.ok)

  const submit = () => {
    if (!parsed || !parsed.kerf.ok || !parsed.endTrim.ok || !parsed.minOffcut.ok) return
    const lines = (stock.data ?? []).flatMap((p) =>
      p.sticks.flatMap((s) => {
        const c = choice[key(p.partId, s.stickLength)] ?? { use: s.available > 0, max: s.available }
        return c.use && c.max > 0 ? [{ partId: p.partId, stickLength: s.stickLength, maxSticks: c.max }] : []
      }),
    )
    const input: PlanCutRunInput = {
      workOrderIds: chosen.map((w) => w.id),
      stock: lines,
      useOffcuts,
      kerf: parsed.kerf.value,
      endTrim: parsed.endTrim.value,
      minOffcut: parsed.minOffcut.value,
      timeLimitSeconds: seconds,
    }
    plan.mutate(input, { onSuccess: onPlanned })
  }

  return (
    <form
      aria-label="Plan a cut run"
      className="space-y-4"
      onSubmit={(e) => {
        e.preventDefault()
        submit()
      }}
    >
      <Section title="1. Work orders">
        <div className="flex flex-wrap items-end gap-4">
          <Field label="Which work orders">
            <Select value={mode} onChange={(e) => setMode(e.target.value as Mode)} aria-label="Which work orders">
              <option value="all">Everything released and not yet cut</option>
              <option value="due">Due by a date</option>
              <option value="kit">One kit</option>
            </Select>
          </Field>
          {mode === 'due' && (
            <Field label="Due by">
              <Input type="date" value={dueBy} onChange={(e) => setDueBy(e.target.value)} />
            </Field>
          )}
          {mode === 'kit' && (
            <Field label="Kit">
              <Select value={kitId} onChange={(e) => setKitId(e.target.value)}>
                <option value="">Choose a kit</option>
                {kits.map(([id, name]) => (
                  <option key={id} value={id}>
                    {name}
                  </option>
                ))}
              </Select>
            </Field>
          )}
        </div>
        {candidates.isError && <p role="alert" className="text-red-700">{candidates.error.message}</p>}
        {candidates.data?.length === 0 && <p className="text-stone-600">No work orders wait to be cut{mode !== 'all' ? ' for this choice' : ''}.</p>}
        <ul className="grid gap-1 sm:grid-cols-2 lg:grid-cols-3">
          {(candidates.data ?? []).map((w) => (
            <li key={w.id}>
              <label className="flex min-h-11 items-center gap-3 rounded-md border border-stone-200 px-3 py-1">
                <input
                  type="checkbox"
                  className="size-5"
                  checked={!unselected.has(w.id)}
                  onChange={(e) => {
                    const next = new Set(unselected)
                    if (e.target.checked) next.delete(w.id)
                    else next.add(w.id)
                    setUnselected(next)
                  }}
                />
                <span>
                  <span className="font-bold">WO {w.serial}</span> {w.kitSku} rev {w.revisionCode}
                  <span className="block text-sm text-stone-600">
                    {w.pieceCount} pieces, {format(w.pieceLength)}
                    {w.dueDate ? ` · due ${w.dueDate}` : ''} · order {w.orderNumber}
                  </span>
                </span>
              </label>
            </li>
          ))}
        </ul>
        <p className="text-sm text-stone-600">{chosen.length} chosen</p>
      </Section>

      <Section title="2. Stock to cut from (on hand in the ledger)">
        {(stock.data ?? []).map((p) => (
          <div key={p.partId} className="space-y-2">
            <p className="font-bold">
              {p.sku} {p.name}
            </p>
            <div className="flex flex-wrap gap-3">
              {p.sticks.map((s) => {
                const c = choice[key(p.partId, s.stickLength)] ?? { use: s.available > 0, max: s.available }
                const set = (next: Partial<typeof c>) => setChoice({ ...choice, [key(p.partId, s.stickLength)]: { ...c, ...next } })
                return (
                  <div key={s.stickLength} className="flex items-center gap-2 rounded-md border border-stone-200 p-2">
                    <label className="flex items-center gap-2">
                      <input type="checkbox" className="size-5" checked={c.use} onChange={(e) => set({ use: e.target.checked })} />
                      <span>
                        {format(s.stickLength)} sticks: {s.available} available ({s.onHand} on hand)
                      </span>
                    </label>
                    <Input
                      type="number"
                      min={0}
                      className="w-24"
                      aria-label={`Most ${format(s.stickLength)} sticks of ${p.sku}`}
                      value={c.max}
                      onChange={(e) => set({ max: Math.max(0, Math.floor(Number(e.target.value) || 0)) })}
                    />
                  </div>
                )
              })}
            </div>
            <p className="text-sm text-stone-600">
              Offcuts on the rack: {p.offcuts.length === 0 ? 'none' : p.offcuts.map((o) => `${format(o.length)} (${o.code})`).join(', ')}
            </p>
          </div>
        ))}
        <label className="flex items-center gap-2">
          <input type="checkbox" className="size-5" checked={useOffcuts} onChange={(e) => setUseOffcuts(e.target.checked)} />
          Use offcuts first when they do not raise the cost
        </label>
      </Section>

      <Section title="3. Saw settings">
        {saw && (
          <div className="grid gap-4 sm:grid-cols-4">
            <Field label="Kerf" error={parsed && !parsed.kerf.ok ? parsed.kerf.message : undefined}>
              <Input value={saw.kerf} onChange={(e) => setSaw({ ...saw, kerf: e.target.value })} />
            </Field>
            <Field label="End trim" error={parsed && !parsed.endTrim.ok ? parsed.endTrim.message : undefined}>
              <Input value={saw.endTrim} onChange={(e) => setSaw({ ...saw, endTrim: e.target.value })} />
            </Field>
            <Field label="Keep offcuts from" error={parsed && !parsed.minOffcut.ok ? parsed.minOffcut.message : undefined}>
              <Input value={saw.minOffcut} onChange={(e) => setSaw({ ...saw, minOffcut: e.target.value })} />
            </Field>
            <Field label="Time limit (seconds)">
              <Input type="number" min={0.5} max={120} step={0.5} value={seconds} onChange={(e) => setSeconds(Math.min(120, Math.max(0.5, Number(e.target.value) || 2)))} />
            </Field>
          </div>
        )}
      </Section>

      {plan.isPending && <PlanProgress limitSeconds={seconds} />}
      {plan.error && (
        <p role="alert" className="rounded-md bg-red-50 p-3 text-red-800">
          {plan.error instanceof ApiError ? plan.error.message : 'The plan could not be made; try again.'}
        </p>
      )}
      <Button type="submit" disabled={plan.isPending || chosen.length === 0 || !!sawError}>
        Run the engine
      </Button>
    </form>
  )
}
