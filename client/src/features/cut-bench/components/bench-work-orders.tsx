import { toast } from 'sonner'
import type { CutRunDetail } from '@kitwright/shared/cut-runs'
import { ScanField } from '../../../components/ui/scan-field'
import { binLabelHref, useAssignBin } from '../api/cut-bench-queries'

/**
 * The work orders of the run with their bins. A scan assigns the bin to the work order waiting for
 * one: first a unit whose pieces are all cut, else the next unit without a bin.
 */
export function BenchWorkOrders({ run }: { run: CutRunDetail }) {
  const assign = useAssignBin()
  const needing = run.workOrders.filter((w) => !w.bin)
  const target = needing.find((w) => w.cut === w.pieces) ?? needing[0]
  return (
    <section aria-label="Bins" className="space-y-3">
      <ScanField
        label={target ? `Scan a free bin for WO ${target.serial}` : 'Every unit of this run has its bin'}
        disabled={!target || assign.isPending}
        onScan={(code) =>
          target &&
          assign.mutate(
            { runId: run.id, workOrderId: target.id, code },
            { onSuccess: () => toast.success(`Bin ${code.toUpperCase()} is now WO ${target.serial}'s`), onError: (e) => toast.error(e.message) },
          )
        }
      />
      <ul className="space-y-2">
        {run.workOrders.map((w) => {
          const complete = w.cut === w.pieces
          return (
            <li key={w.id} className={`rounded-lg border-2 p-3 text-xl ${complete ? (w.bin ? 'border-green-600 bg-green-50' : 'border-amber-500 bg-amber-50') : 'border-stone-200'}`}>
              <p>
                <strong>WO {w.serial}</strong> {w.kitSku} {w.revisionCode} · {w.cut}/{w.pieces} pieces cut
              </p>
              {w.bin ? (
                <p className="flex flex-wrap items-center gap-3">
                  {complete ? 'All cut: ' : ''}fill bin <strong>{w.bin.code}</strong>
                  <a className="inline-flex h-12 items-center rounded-md border-2 border-stone-400 bg-white px-4 font-bold" href={binLabelHref(w.bin.id)} target="_blank" rel="noreferrer">
                    Bin label
                  </a>
                </p>
              ) : complete ? (
                <p className="font-bold">All pieces cut: scan a free bin and fill it.</p>
              ) : null}
            </li>
          )
        })}
      </ul>
    </section>
  )
}
