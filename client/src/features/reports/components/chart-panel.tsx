import { useId, useState, type ReactNode } from 'react'
import { Button } from '../../../components/ui/button'
import { ExportLink } from './export-link'

/**
 * A chart with its numbers one click away: "Show the numbers" reveals the table the chart is drawn
 * from, and the CSV link downloads the same table.
 */
export function ChartPanel({ title, note, csvHref, chart, table }: { title: string; note: string; csvHref: string; chart: ReactNode; table: ReactNode }) {
  const [open, setOpen] = useState(false)
  const id = useId()
  return (
    <section aria-labelledby={`${id}-title`} className="space-y-3 rounded-lg border border-stone-300 bg-white p-4">
      <div className="flex flex-wrap items-center justify-between gap-2">
        <h2 id={`${id}-title`} className="text-xl font-bold">
          {title}
        </h2>
        <div className="flex gap-2">
          <Button variant="secondary" size="sm" aria-expanded={open} aria-controls={`${id}-numbers`} onClick={() => setOpen((v) => !v)}>
            {open ? 'Hide the numbers' : 'Show the numbers'}
          </Button>
          <ExportLink href={csvHref} label={title} />
        </div>
      </div>
      <p className="text-sm text-stone-600">{note}</p>
      {chart}
      <div id={`${id}-numbers`} hidden={!open}>
        {open && table}
      </div>
    </section>
  )
}
