import type { PartUnitWeight } from '@kitwright/shared/bag-weights'
import { formatDateTime } from '@kitwright/shared/dates'
import { formatGrams, formatOunces } from '@kitwright/shared/domain/bag-weight'
import { Button } from '../../../components/ui/button'
import { SampleForm } from './sample-form'

/** Every part counted by weight: its unit weight, spread, how it was found, and a sample to weigh. */
export function UnitWeightsList({ parts, editing, onEdit, canEdit }: { parts: PartUnitWeight[]; editing: string | null; onEdit: (partId: string | null) => void; canEdit: boolean }) {
  return (
    <ul aria-label="Unit weights" className="space-y-2">
      {parts.map((p) => (
        <li key={p.partId} aria-label={p.name} className="space-y-2 rounded-lg border border-stone-300 bg-white p-3">
          <div className="flex flex-wrap items-center gap-3">
            <div className="min-w-0 flex-1">
              <p className="text-lg font-bold">
                {p.name} <span className="font-mono text-sm font-normal text-stone-600">{p.sku}</span>
              </p>
              {p.current ? (
                <>
                  <p className="text-base">
                    <strong>{formatGrams(p.current.unitMg)}</strong> each ({formatOunces(p.current.unitMg)}) · spread ±{formatGrams(p.current.spreadMg)}{' '}
                    {p.current.spreadSource === 'singles' ? `from ${p.current.singlesMg.length} single pieces` : 'typed'}
                    {p.current.packedLoose ? ' · goes loose in the hardware bag' : ''}
                  </p>
                  <p className="text-sm text-stone-600">
                    {p.current.division} · weighed by {p.current.recordedBy.name}, {formatDateTime(p.current.recordedAt)}
                  </p>
                </>
              ) : (
                <p className="text-base text-stone-600">Not weighed yet: needed only if it goes in a hardware bag or a spare pack</p>
              )}
            </div>
            {canEdit && editing !== p.partId && (
              <Button variant="secondary" onClick={() => onEdit(p.partId)}>
                Weigh a sample
              </Button>
            )}
          </div>
          {editing === p.partId && <SampleForm part={p} onDone={() => onEdit(null)} />}
        </li>
      ))}
    </ul>
  )
}
