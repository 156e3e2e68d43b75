import { useQuery } from '@tanstack/react-query'
import { useEffect, useMemo, useState } from 'react'
import type { CandidateQuery, CutRunDetail, PlanCutRunInput } from '@kitwright/shared/cut-runs'
import { Button } from '../../../components/ui/button'
import { ApiError } from '../../../lib/api-client'
import { shopSettingsOptions, useLengthUnit } from '../../../lib/shop-settings'
import { candidatesOptions, pipeStockOptions, usePlanCutRun } from '../api/cut-run-queries'
import { PlanProgress } from './plan-progress'
import { SawSettings, StockPicker, WorkOrderPicker, stockLines, type Mode, type SawParsed, type SawText, type StockChoice } from './plan-form-sections'

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
  const [saw, setSaw] = useState<SawText | null>(null)
  // The shop's planning time until the planner types another.
  const [typedSeconds, setSeconds] = useState<number | null>(null)
  const seconds = typedSeconds ?? settings.data?.nestingTimeLimitSeconds ?? 2
  const plan = usePlanCutRun()

  useEffect(() => {
    if (settings.data && !saw) setSaw({ kerf: formatInput(settings.data.kerf), endTrim: formatInput(settings.data.endTrim), minOffcut: formatInput(settings.data.minOffcut) })
  }, [settings.data, saw, formatInput])

  const kits = useMemo(() => [...new Map((all.data ?? []).map((w) => [w.kitId, `${w.kitSku} ${w.kitName}`])).entries()], [all.data])
  const chosen = (candidates.data ?? []).filter((w) => !unselected.has(w.id))
  const parsed: SawParsed | null = saw ? { kerf: parse(saw.kerf), endTrim: parse(saw.endTrim), minOffcut: parse(saw.minOffcut) } : null
  const sawError = parsed && Object.values(parsed).find((p) => !p.ok)

  const submit = () => {
    if (!parsed || !parsed.kerf.ok || !parsed.endTrim.ok || !parsed.minOffcut.ok) return
    const input: PlanCutRunInput = {
      workOrderIds: chosen.map((w) => w.id),
      stock: stockLines(stock.data ?? [], choice),
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
      <WorkOrderPicker
        mode={mode}
        setMode={setMode}
        dueBy={dueBy}
        setDueBy={setDueBy}
        kitId={kitId}
        setKitId={setKitId}
        kits={kits}
        candidates={candidates}
        unselected={unselected}
        setUnselected={setUnselected}
        chosenCount={chosen.length}
        format={format}
      />
      <StockPicker stock={stock.data ?? []} choice={choice} setChoice={setChoice} useOffcuts={useOffcuts} setUseOffcuts={setUseOffcuts} format={format} />
      <SawSettings saw={saw} setSaw={setSaw} parsed={parsed} seconds={seconds} setSeconds={setSeconds} />

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
