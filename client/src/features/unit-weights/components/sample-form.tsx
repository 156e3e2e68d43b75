import { useState, type FormEvent } from 'react'
import type { PartUnitWeight } from '@kitwright/shared/bag-weights'
import { formatGrams, parseWeight, sampleUnitWeight, spreadFromSingles } from '@kitwright/shared/domain/bag-weight'
import { Button } from '../../../components/ui/button'
import { Field, Input } from '../../../components/ui/field'
import { ApiError } from '../../../lib/api-client'
import { useRecordUnitWeight } from '../api/unit-weight-queries'

/** Splits "4.21 g, 4.30 g; 4.24 g" into single weights. */
const splitSingles = (text: string) => text.split(/[,;\n]+/).map((s) => s.trim()).filter(Boolean)

/** What the sample gives, worked out as the person types (the server works it out again on saving). */
function preview(name: string, count: string, weight: string, singles: string, tolerance: string): { lines: string[]; problem: string | null } {
  const n = Number(count)
  const w = parseWeight(weight)
  if (!count || !weight) return { lines: [], problem: null }
  if (!Number.isInteger(n) || n < 1) return { lines: [], problem: 'Count at least 1 piece onto the scale' }
  if (!w.ok) return { lines: [], problem: w.message }
  if (w.mg <= 0) return { lines: [], problem: 'The sample must weigh more than 0 g' }
  const s = sampleUnitWeight(n, w.mg, name)
  const lines = [s.words]
  const singleTexts = splitSingles(singles)
  if (singleTexts.length >= 2) {
    const parsed = singleTexts.map(parseWeight)
    const bad = parsed.find((p) => !p.ok)
    if (bad && !bad.ok) return { lines, problem: bad.message }
    const mgs = parsed.map((p) => (p.ok ? p.mg : 0))
    lines.push(`Spread: the farthest single piece is ±${formatGrams(spreadFromSingles(s.unitMg, mgs))} from ${formatGrams(s.unitMg)}`)
  } else if (tolerance) {
    const t = parseWeight(tolerance)
    if (!t.ok) return { lines, problem: t.message }
    lines.push(`Spread: ±${formatGrams(t.mg)} per piece, as typed`)
  }
  return { lines, problem: null }
}

/** Weigh a counted sample of one part: the count, the weight, the spread, whether it goes loose in the bag. */
export function SampleForm({ part, onDone }: { part: PartUnitWeight; onDone: () => void }) {
  const record = useRecordUnitWeight()
  const [count, setCount] = useState('')
  const [weight, setWeight] = useState('')
  const [singles, setSingles] = useState('')
  const [tolerance, setTolerance] = useState('')
  const [packedLoose, setPackedLoose] = useState(part.current?.packedLoose ?? false)
  const [errors, setErrors] = useState<Record<string, string>>({})
  const [problem, setProblem] = useState<string | null>(null)
  const shown = preview(part.name, count, weight, singles, tolerance)

  async function submit(e: FormEvent) {
    e.preventDefault()
    setErrors({})
    setProblem(null)
    const singleTexts = splitSingles(singles)
    try {
      await record.mutateAsync({
        partId: part.partId,
        sampleCount: Number(count),
        sampleWeight: weight,
        ...(singleTexts.length > 0 ? { singles: singleTexts } : {}),
        ...(tolerance.trim() ? { spread: tolerance } : {}),
        packedLoose,
      })
      onDone()
    } catch (err) {
      if (err instanceof ApiError && err.body.fields) setErrors(err.body.fields)
      setProblem(err instanceof Error ? err.message : String(err))
    }
  }

  return (
    <form aria-label={`Weigh a sample of ${part.name}`} onSubmit={(e) => void submit(e)} className="space-y-3 rounded-lg border-2 border-brand-600 bg-white p-4">
      <p className="text-lg font-bold">Weigh a counted sample of {part.name}</p>
      <p className="text-sm text-stone-700">Tare the scale with the empty tray, count 20 or more pieces onto it, and type what it shows with its unit.</p>
      <div className="grid gap-3 sm:grid-cols-2">
        <Field label="Pieces on the scale" error={errors.sampleCount}>
          <Input value={count} onChange={(e) => setCount(e.target.value)} inputMode="numeric" placeholder="e.g. 50" />
        </Field>
        <Field label="They weigh" error={errors.sampleWeight} hint="With its unit: 212.4 g, 7.5 oz, 0.47 lb">
          <Input value={weight} onChange={(e) => setWeight(e.target.value)} placeholder="e.g. 212.4 g" />
        </Field>
        <Field label="Single pieces, weighed one by one" error={errors.singles} hint="2 or more, separated by commas: 4.21 g, 4.30 g, 4.24 g">
          <Input value={singles} onChange={(e) => setSingles(e.target.value)} placeholder="e.g. 4.21 g, 4.30 g, 4.24 g" />
        </Field>
        <Field label="…or the tolerance per piece (±)" error={errors.spread} hint="From the supplier's drawing, or common practice for the part">
          <Input value={tolerance} onChange={(e) => setTolerance(e.target.value)} placeholder="e.g. 0.05 g" />
        </Field>
      </div>
      <label className="flex items-center gap-3 text-base">
        <input type="checkbox" checked={packedLoose} onChange={(e) => setPackedLoose(e.target.checked)} className="h-6 w-6" />
        Goes loose in a built kit's hardware bag (net cups, collars); leave unticked for parts fitted at the build bench
      </label>
      {shown.lines.length > 0 && (
        <ul aria-label="What the sample gives" className="list-disc pl-6 text-base">
          {shown.lines.map((l) => (
            <li key={l}>{l}</li>
          ))}
        </ul>
      )}
      {(shown.problem ?? problem) && (
        <p role="alert" className="text-base font-bold text-red-700">
          {shown.problem ?? problem}
        </p>
      )}
      <div className="flex gap-3">
        <Button type="submit" disabled={record.isPending}>
          Keep this unit weight
        </Button>
        <Button variant="secondary" onClick={onDone}>
          Cancel
        </Button>
      </div>
    </form>
  )
}
