import { useState } from 'react'
import type { Return, ReturnDecision } from '@kitwright/shared/returns'
import { RETURN_DECISION_LABELS } from '@kitwright/shared/status-words'
import { Button } from '../../../components/ui/button'
import { Field, Input } from '../../../components/ui/field'
import { ApiError } from '../../../lib/api-client'
import { useDecideReturn } from '../api/return-queries'

const WHAT: Record<ReturnDecision, string> = {
  repair: 'The unit goes back to the build bench in rework: the steps you tick below are done again, and it needs a new leak test before it is ready.',
  replace: 'A new unit of the same kit is made for the customer at no charge, on its own order, released the normal way (its parts are reserved).',
  refund: 'The store pays the money back; Kitwright records the amount and your note.',
}

/** Dollars and cents as typed (`12.34`, `$12`) → whole cents, or null when it is not an amount. */
function toCents(text: string): number | null {
  const m = /^\s*\$?\s*(\d+)(?:\.(\d{1,2}))?\s*$/.exec(text)
  if (!m) return null
  return Number(m[1]) * 100 + Number((m[2] ?? '').padEnd(2, '0'))
}

/** Repair, replace or refund noted, for a return back in the shop. */
export function DecisionForm({ ret }: { ret: Return }) {
  const decide = useDecideReturn()
  const [choice, setChoice] = useState<ReturnDecision | null>(null)
  const [reopen, setReopen] = useState<string[]>([])
  const [note, setNote] = useState('')
  const [allowShort, setAllowShort] = useState(false)
  const [amount, setAmount] = useState('')
  const [amountProblem, setAmountProblem] = useState<string | null>(null)
  const fields = decide.error instanceof ApiError ? (decide.error.body.fields ?? {}) : {}

  const submit = () => {
    if (!choice) return
    if (choice === 'repair') decide.mutate({ id: ret.id, decision: 'repair', reopenStepIds: reopen, note: note || null })
    else if (choice === 'replace') decide.mutate({ id: ret.id, decision: 'replace', allowShort, note: note || null })
    else {
      const cents = toCents(amount)
      if (cents === null) {
        setAmountProblem('Type the amount refunded in dollars and cents, e.g. 189.00')
        return
      }
      setAmountProblem(null)
      decide.mutate({ id: ret.id, decision: 'refund', amountCents: cents, note })
    }
  }

  return (
    <form
      aria-label="Decision"
      className="space-y-4"
      onSubmit={(e) => {
        e.preventDefault()
        submit()
      }}
    >
      <div role="radiogroup" aria-label="Decide" className="flex flex-wrap gap-3">
        {(['repair', 'replace', 'refund'] as const).map((d) => (
          <Button key={d} size="bench" role="radio" aria-checked={choice === d} variant={choice === d ? 'primary' : 'secondary'} onClick={() => setChoice(d)}>
            {RETURN_DECISION_LABELS[d]}
          </Button>
        ))}
      </div>
      {choice && <p className="text-lg">{WHAT[choice]}</p>}
      {choice === 'repair' && (
        <fieldset className="space-y-2">
          <legend className="text-sm font-bold text-stone-700">Steps to do again (their ticks are undone)</legend>
          {ret.steps.map((s) => (
            <label key={s.id} className="flex min-h-12 items-center gap-3 rounded-md border border-stone-200 px-3 text-lg">
              <input
                type="checkbox"
                className="size-6"
                checked={reopen.includes(s.id)}
                onChange={(e) => setReopen((list) => (e.target.checked ? [...list, s.id] : list.filter((x) => x !== s.id)))}
              />
              <span>
                {s.position}. {s.text}
              </span>
            </label>
          ))}
          {fields.reopenStepIds && (
            <p role="alert" className="text-red-700">
              {fields.reopenStepIds}
            </p>
          )}
        </fieldset>
      )}
      {choice === 'replace' && (
        <label className="flex min-h-12 items-center gap-3 text-lg">
          <input type="checkbox" className="size-6" checked={allowShort} onChange={(e) => setAllowShort(e.target.checked)} />
          Release it even if parts are short (the shortage is recorded, as on the orders page)
        </label>
      )}
      {choice === 'refund' && (
        <Field label={`Amount refunded (${ret.order.currency})`} error={amountProblem ?? fields.amountCents}>
          <Input inputMode="decimal" value={amount} onChange={(e) => setAmount(e.target.value)} className="h-14 text-lg" aria-invalid={amountProblem || fields.amountCents ? true : undefined} />
        </Field>
      )}
      {choice && (
        <Field label={choice === 'refund' ? 'How the store refunded it' : 'Note (optional)'} error={fields.note}>
          <Input value={note} onChange={(e) => setNote(e.target.value)} className="h-14 text-lg" />
        </Field>
      )}
      {decide.isError && Object.keys(fields).length === 0 && (
        <p role="alert" className="rounded-md border-2 border-red-600 bg-red-50 p-3 text-lg text-red-900">
          {decide.error.message}
        </p>
      )}
      {choice && (
        <Button type="submit" size="bench" disabled={decide.isPending}>
          {decide.isPending ? 'Saving…' : `Decide: ${RETURN_DECISION_LABELS[choice]}`}
        </Button>
      )}
    </form>
  )
}
