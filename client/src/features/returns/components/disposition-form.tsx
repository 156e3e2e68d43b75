import { useState } from 'react'
import type { Return, ReturnDisposition } from '@kitwright/shared/returns'
import { RETURN_DISPOSITION_LABELS } from '@kitwright/shared/status-words'
import { Button } from '../../../components/ui/button'
import { Field, Input } from '../../../components/ui/field'
import { ApiError } from '../../../lib/api-client'
import { useDisposeReturnedUnit } from '../api/return-queries'

/** What each choice means in the shop, in words (the stock ledger counts parts, not finished units). */
const WHAT: Record<ReturnDisposition, string> = {
  spare:
    'The unit is kept whole on the spares shelf under its serial, and its build record says so. Stock counts stay as they are: the stock ledger counts parts, and this unit’s parts left it when it first shipped.',
  scrapped: 'The unit is thrown away; say why. Its build record and the order’s timeline keep the reason. Stock counts stay as they are.',
}

/** Back to stock as a spare, or scrapped: what becomes of a replaced or refunded unit, recorded once. */
export function DispositionForm({ ret }: { ret: Return }) {
  const dispose = useDisposeReturnedUnit()
  const [choice, setChoice] = useState<ReturnDisposition | null>(null)
  const [note, setNote] = useState('')
  const fields = dispose.error instanceof ApiError ? (dispose.error.body.fields ?? {}) : {}
  return (
    <form
      aria-label="The returned unit"
      className="space-y-4"
      onSubmit={(e) => {
        e.preventDefault()
        if (!choice || dispose.isPending) return
        if (choice === 'spare') dispose.mutate({ id: ret.id, disposition: 'spare', note: note || null })
        else dispose.mutate({ id: ret.id, disposition: 'scrapped', note })
      }}
    >
      <p className="text-lg">Unit {ret.unit.serial} is back in the shop and the customer no longer gets it: record what becomes of it.</p>
      <div role="radiogroup" aria-label="What becomes of the unit" className="flex flex-wrap gap-3">
        {(['spare', 'scrapped'] as const).map((d) => (
          <Button key={d} size="bench" role="radio" aria-checked={choice === d} variant={choice === d ? 'primary' : 'secondary'} onClick={() => {
              setChoice(d)
              if (dispose.isError) dispose.reset()
            }}>
            {RETURN_DISPOSITION_LABELS[d]}
          </Button>
        ))}
      </div>
      {choice && <p className="text-lg">{WHAT[choice]}</p>}
      {choice && (
        <Field label={choice === 'scrapped' ? 'Why it is scrapped' : 'Note (optional: which shelf, what it lacks)'} error={fields.note}>
          <Input value={note} onChange={(e) => {
              setNote(e.target.value)
              // The refusal was about the old text: once it changes, the message would mislead.
              if (dispose.isError) dispose.reset()
            }} className="h-14 text-lg" aria-invalid={fields.note ? true : undefined} />
        </Field>
      )}
      {dispose.isError && Object.keys(fields).length === 0 && (
        <p role="alert" className="rounded-md border-2 border-red-600 bg-red-50 p-3 text-lg text-red-900">
          {dispose.error.message}
        </p>
      )}
      {choice && (
        <Button type="submit" size="bench" disabled={dispose.isPending}>
          {dispose.isPending ? 'Saving…' : `Record: ${RETURN_DISPOSITION_LABELS[choice]}`}
        </Button>
      )}
    </form>
  )
}
