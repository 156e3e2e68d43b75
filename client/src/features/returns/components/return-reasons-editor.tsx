import { useQuery } from '@tanstack/react-query'
import { useEffect, useState } from 'react'
import { Button } from '../../../components/ui/button'
import { Input } from '../../../components/ui/field'
import { Section } from '../../../components/ui/section'
import { ApiError } from '../../../lib/api-client'
import { returnReasonsOptions, useSetReturnReasons } from '../api/return-queries'

/** The owner's list of return reasons, in the order the office sees them. Returns opened keep their reason. */
export function ReturnReasonsEditor() {
  const reasons = useQuery(returnReasonsOptions())
  const save = useSetReturnReasons()
  const [list, setList] = useState<string[]>([])
  const [saved, setSaved] = useState(false)
  useEffect(() => {
    if (reasons.data) setList(reasons.data.reasons)
  }, [reasons.data])
  const fields = save.error instanceof ApiError ? (save.error.body.fields ?? {}) : {}
  const problem = save.error ? Object.values(fields)[0] ?? save.error.message : null
  const move = (i: number, by: -1 | 1) =>
    setList((l) => {
      const next = [...l]
      const [item] = next.splice(i, 1)
      next.splice(i + by, 0, item!)
      return next
    })
  return (
    <Section title="Return reasons" id="return-reasons">
      <p className="text-stone-600">
        What the office chooses from when it opens a return{reasons.data?.defaults ? ' (the defaults until you save your own list)' : ''}. Renaming a reason leaves returns already opened as they were.
      </p>
      <form
        aria-label="Return reasons"
        className="space-y-2"
        onSubmit={(e) => {
          e.preventDefault()
          setSaved(false)
          save.mutate(
            list.map((r) => r.trim()).filter(Boolean),
            { onSuccess: () => setSaved(true) },
          )
        }}
      >
        <ol className="space-y-2">
          {list.map((r, i) => (
            <li key={i} className="flex gap-2">
              <Input aria-label={`Reason ${i + 1}`} value={r} onChange={(e) => setList((l) => l.map((x, j) => (j === i ? e.target.value : x)))} />
              <Button variant="secondary" aria-label={`Move reason ${i + 1} up`} disabled={i === 0} onClick={() => move(i, -1)}>
                ↑
              </Button>
              <Button variant="secondary" aria-label={`Move reason ${i + 1} down`} disabled={i === list.length - 1} onClick={() => move(i, 1)}>
                ↓
              </Button>
              <Button variant="ghost" aria-label={`Remove reason ${i + 1}`} onClick={() => setList((l) => l.filter((_, j) => j !== i))}>
                Remove
              </Button>
            </li>
          ))}
        </ol>
        <div className="flex flex-wrap gap-2">
          <Button variant="secondary" onClick={() => setList((l) => [...l, ''])}>
            Add a reason
          </Button>
          <Button type="submit" disabled={save.isPending}>
            {save.isPending ? 'Saving…' : 'Save reasons'}
          </Button>
        </div>
        {problem && (
          <p role="alert" className="text-red-700">
            {problem}
          </p>
        )}
        {saved && !save.isError && <p role="status">Reasons saved.</p>}
      </form>
    </Section>
  )
}
