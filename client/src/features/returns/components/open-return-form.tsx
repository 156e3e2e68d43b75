import { useQuery } from '@tanstack/react-query'
import { useState } from 'react'
import type { ReturnableUnit } from '@kitwright/shared/returns'
import { Button } from '../../../components/ui/button'
import { Field, Select } from '../../../components/ui/field'
import { ApiError } from '../../../lib/api-client'
import { returnReasonsOptions, useOpenReturn } from '../api/return-queries'

/** The form under a scanned unit: the shop's reason, notes, and Open. */
export function OpenReturnForm({ unit, onOpened }: { unit: ReturnableUnit; onOpened: (id: string) => void }) {
  const reasons = useQuery(returnReasonsOptions())
  const open = useOpenReturn()
  const [reason, setReason] = useState('')
  const [notes, setNotes] = useState('')
  const fields = open.error instanceof ApiError ? (open.error.body.fields ?? {}) : {}
  return (
    <form
      aria-label={`Open a return of ${unit.serial}`}
      className="space-y-3"
      onSubmit={(e) => {
        e.preventDefault()
        open.mutate({ serial: unit.serial, reason, notes: notes || null }, { onSuccess: (r) => onOpened(r.id) })
      }}
    >
      <Field label="Reason" error={fields.reason}>
        <Select value={reason} onChange={(e) => {
            setReason(e.target.value)
            open.reset()
          }} aria-invalid={fields.reason ? true : undefined} className="h-14 text-lg">
          <option value="">Choose the customer's reason…</option>
          {(reasons.data?.reasons ?? []).map((r) => (
            <option key={r} value={r}>
              {r}
            </option>
          ))}
        </Select>
      </Field>
      <Field label="Notes (what the customer says, what you see)" error={fields.notes}>
        <textarea
          value={notes}
          onChange={(e) => setNotes(e.target.value)}
          rows={3}
          className="w-full rounded-md border border-stone-300 bg-white p-3 text-lg focus:border-brand-600 focus:outline-2 focus:outline-brand-600"
        />
      </Field>
      {open.isError && !fields.reason && !fields.notes && (
        <p role="alert" className="rounded-md border-2 border-red-600 bg-red-50 p-3 text-lg text-red-900">
          {open.error.message}
        </p>
      )}
      <Button type="submit" size="bench" disabled={open.isPending}>
        {open.isPending ? 'Opening…' : `Open return of ${unit.serial}`}
      </Button>
    </form>
  )
}
