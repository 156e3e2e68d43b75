import { useQuery } from '@tanstack/react-query'
import { useState } from 'react'
import { toast } from 'sonner'
import { Button } from '../../../components/ui/button'
import { Field, Input } from '../../../components/ui/field'
import { Section } from '../../../components/ui/section'
import { binBatchLabelsHref, binLabelsHref, binsListOptions, useCreateBins } from '../../../features/bins/api/bin-queries'

const linkButton = 'inline-flex h-11 items-center rounded-md border border-stone-300 bg-white px-4 font-bold hover:bg-stone-50'

export function Component() {
  const bins = useQuery(binsListOptions())
  const create = useCreateBins()
  const [count, setCount] = useState(10)
  // The batch just added, to print its labels in one go.
  const [batch, setBatch] = useState<{ from: string; to: string; count: number } | null>(null)
  return (
    <div className="space-y-6">
      <h1 className="text-3xl font-bold">Bins</h1>
      <p className="text-stone-700">A bin travels with one unit from the cut bench to the pack bench. Its label carries a Code 128 barcode of its code.</p>
      <Section title="Add bins">
        <form
          aria-label="Add bins"
          className="flex flex-wrap items-end gap-3"
          onSubmit={(e) => {
            e.preventDefault()
            create.mutate(
              { count },
              {
                onSuccess: (made) => {
                  toast.success(`Added ${made.length} bins: ${made[0]?.code} to ${made.at(-1)?.code}`)
                  if (made.length > 0) setBatch({ from: made[0]!.code, to: made.at(-1)!.code, count: made.length })
                },
                onError: (err) => toast.error(err.message),
              },
            )
          }}
        >
          <Field label="How many">
            <Input type="number" min={1} max={500} value={count} onChange={(e) => setCount(Math.floor(Number(e.target.value) || 0))} className="w-32" />
          </Field>
          <Button type="submit" disabled={create.isPending}>
            Add bins
          </Button>
        </form>
        {batch && (
          <div role="group" aria-label="Labels of the new bins" className="flex flex-wrap items-center gap-2 rounded-md border-2 border-brand-600 bg-brand-50 p-3">
            <span className="font-bold">
              Print the {batch.count} new labels ({batch.from} to {batch.to}):
            </span>
            <a className={linkButton} href={binBatchLabelsHref('2x1', batch.from, batch.to)}>2 × 1 in</a>
            <a className={linkButton} href={binBatchLabelsHref('4x6', batch.from, batch.to)}>4 × 6 in</a>
            <a className={linkButton} href={binBatchLabelsHref('letter', batch.from, batch.to)}>Letter sheet</a>
          </div>
        )}
        <div className="flex flex-wrap items-center gap-2">
          <span className="text-stone-700">Every bin:</span>
          <a className={linkButton} href={binLabelsHref('2x1')}>Labels 2 × 1 in</a>
          <a className={linkButton} href={binLabelsHref('4x6')}>Labels 4 × 6 in</a>
          <a className={linkButton} href={binLabelsHref('letter')}>Letter sheet</a>
        </div>
      </Section>
      <Section title={`All bins (${bins.data?.length ?? 0})`}>
        <table className="w-full text-left">
          <thead className="text-sm text-stone-600">
            <tr>
              <th className="py-1">Code</th>
              <th>Status</th>
              <th>Work order</th>
              <th>Label</th>
            </tr>
          </thead>
          <tbody>
            {(bins.data ?? []).map((b) => (
              <tr key={b.id} className="border-t border-stone-200">
                <td className="py-2 font-mono font-bold">{b.code}</td>
                <td>{b.status === 'free' ? 'Free' : 'In use'}</td>
                <td>{b.workOrder ? `WO ${b.workOrder.serial}` : ''}</td>
                <td>
                  <a className="text-brand-700 underline" href={binLabelsHref('2x1', [b.id])}>
                    2 × 1 in
                  </a>
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </Section>
    </div>
  )
}
