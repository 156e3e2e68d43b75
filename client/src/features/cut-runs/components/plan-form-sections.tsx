import type { CandidateWorkOrder, PipeStock } from '@kitwright/shared/cut-runs'
import type { Length, ParseLengthResult } from '@kitwright/shared/domain/units'
import { Field, Input, Select } from '../../../components/ui/field'
import { Section } from '../../../components/ui/section'

/** Which work orders the planner starts from. */
export type Mode = 'all' | 'due' | 'kit'
/** Per stick length of a pipe part: whether to cut from it and at most how many sticks. */
export type StockChoice = Record<string, { use: boolean; max: number }>
/** The saw's settings as typed. */
export interface SawText {
  kerf: string
  endTrim: string
  minOffcut: string
}
/** The saw's settings as parsed, each with its error. */
export type SawParsed = Record<keyof SawText, ParseLengthResult>

const choiceKey = (partId: string, length: number) => `${partId}|${length}`

/** The planner's choice for one stick length; untouched, every available stick may be used. */
export function stickChoice(choice: StockChoice, partId: string, stick: PipeStock['sticks'][number]) {
  return choice[choiceKey(partId, stick.stickLength)] ?? { use: stick.available > 0, max: stick.available }
}

/** The stock lines the engine may cut from. */
export function stockLines(stock: PipeStock[], choice: StockChoice) {
  return stock.flatMap((p) =>
    p.sticks.flatMap((s) => {
      const c = stickChoice(choice, p.partId, s)
      return c.use && c.max > 0 ? [{ partId: p.partId, stickLength: s.stickLength, maxSticks: c.max }] : []
    }),
  )
}

/** Step 1: which work orders to cut (everything, due by a date, or one kit), each one untickable. */
export function WorkOrderPicker(props: {
  mode: Mode
  setMode: (m: Mode) => void
  dueBy: string
  setDueBy: (d: string) => void
  kitId: string
  setKitId: (k: string) => void
  kits: [string, string][]
  candidates: { data?: CandidateWorkOrder[]; isError: boolean; error: Error | null }
  unselected: Set<string>
  setUnselected: (s: Set<string>) => void
  chosenCount: number
  format: (v: Length) => string
}) {
  const { mode, setMode, dueBy, setDueBy, kitId, setKitId, kits, candidates, unselected, setUnselected, format } = props
  return (
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
      {candidates.isError && <p role="alert" className="text-red-700">{candidates.error?.message}</p>}
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
      <p className="text-sm text-stone-600">{props.chosenCount} chosen</p>
    </Section>
  )
}

/** Step 2: which pipe stock to cut from, and at most how many sticks of each length. */
export function StockPicker({ stock, choice, setChoice, useOffcuts, setUseOffcuts, format }: {
  stock: PipeStock[]
  choice: StockChoice
  setChoice: (c: StockChoice) => void
  useOffcuts: boolean
  setUseOffcuts: (u: boolean) => void
  format: (v: Length) => string
}) {
  return (
    <Section title="2. Stock to cut from (on hand in the ledger)">
      {stock.map((p) => (
        <div key={p.partId} className="space-y-2">
          <p className="font-bold">
            {p.sku} {p.name}
          </p>
          <div className="flex flex-wrap gap-3">
            {p.sticks.map((s) => {
              const c = stickChoice(choice, p.partId, s)
              const set = (next: Partial<typeof c>) => setChoice({ ...choice, [choiceKey(p.partId, s.stickLength)]: { ...c, ...next } })
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
  )
}

/** Step 3: kerf, end trim, the shortest offcut kept, and how long the engine may plan. */
export function SawSettings({ saw, setSaw, parsed, seconds, setSeconds }: {
  saw: SawText | null
  setSaw: (s: SawText) => void
  parsed: SawParsed | null
  seconds: number
  setSeconds: (s: number) => void
}) {
  return (
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
  )
}
