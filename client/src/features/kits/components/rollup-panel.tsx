import type { RevisionRollup } from '@kitwright/shared/kits'
import { useLengthUnit } from '../../../lib/shop-settings'

// 1 lb = 453.59237 g exactly (international yard and pound agreement, 1959).
const GRAMS_PER_POUND = 453.59237

/** What one unit of the revision costs, weighs and uses of pipe, as last saved. */
export function RollupPanel({ rollup, stale }: { rollup: RevisionRollup; stale: boolean }) {
  const { unit, format } = useLengthUnit()
  const weight = unit === 'in' ? `${(rollup.weightGrams / GRAMS_PER_POUND).toFixed(1)} lb` : `${(rollup.weightGrams / 1000).toFixed(2)} kg`
  const items: [string, string][] = [
    ['Cost per unit', rollup.costCents === null ? '—' : `$${(rollup.costCents / 100).toFixed(2)}`],
    ['Shipping weight', weight],
    ['Pipe cut per unit', format(rollup.cutLength)],
    ['Pipe used with kerf', format(rollup.stickLengthUsed)],
    ['Pieces to cut', String(rollup.pieceCount)],
  ]
  return (
    <section aria-label="Roll-ups per unit" className="rounded-lg border border-stone-300 bg-white p-4">
      <dl className="grid grid-cols-2 gap-3 sm:grid-cols-5">
        {items.map(([label, value]) => (
          <div key={label}>
            <dt className="text-sm text-stone-600">{label}</dt>
            <dd className="text-2xl font-bold">{value}</dd>
          </div>
        ))}
      </dl>
      {stale && <p className="mt-2 text-sm text-stone-600">Figures as last saved; save to update them.</p>}
      {rollup.problems.map((p) => (
        <p key={p} className="mt-2 text-sm text-amber-800">
          {p}
        </p>
      ))}
    </section>
  )
}
