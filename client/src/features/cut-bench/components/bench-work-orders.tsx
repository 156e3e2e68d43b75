import { useQueryClient } from '@tanstack/react-query'
import { toast } from 'sonner'
import type { CutRunDetail } from '@kitwright/shared/cut-runs'
import { ScanField } from '../../../components/ui/scan-field'
import { benchKeys, binLabelHref, useAssignBin } from '../api/cut-bench-queries'

/** The work order a scanned bin goes to: first a unit whose pieces are all cut, else the next unit without a bin. */
function binTarget(run: CutRunDetail) {
  const needing = run.workOrders.filter((w) => !w.bin)
  return needing.find((w) => w.cut === w.pieces) ?? needing[0]
}

/**
 * The work orders of the run with their bins. A scan assigns the bin to the work order waiting for
 * one. Scans queue in the shared scan field; each one reads the run as the previous scan left it,
 * so two bins scanned in quick succession go to two units.
 */
export function BenchWorkOrders({ run }: { run: CutRunDetail }) {
  const qc = useQueryClient()
  const assign = useAssignBin()
  const target = binTarget(run)
  async function onScan(code: string) {
    const latest = qc.getQueryData<CutRunDetail>(benchKeys.run(run.id)) ?? run
    const wo = binTarget(latest)
    if (!wo) throw new Error('Every unit of this run already has its bin')
    await assign.mutateAsync({ runId: run.id, workOrderId: wo.id, code })
    toast.success(`Bin ${code.toUpperCase()} is now WO ${wo.serial}'s`)
  }
  return (
    <section aria-label="Bins" className="space-y-3">
      <ScanField label={target ? `Scan a free bin for WO ${target.serial}` : 'Every unit of this run has its bin'} onScan={onScan} />
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
