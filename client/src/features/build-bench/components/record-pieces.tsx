import type { UnitRecord } from '@kitwright/shared/build'
import { useLengthUnit } from '../../../lib/shop-settings'
import { formatWhen } from './format'

/** Which stick of which cut run each pipe piece came from. */
export function RecordPieces({ record }: { record: UnitRecord }) {
  const { format } = useLengthUnit()
  if (!record.cutThroughKitwright) return <p className="text-lg">Not cut through Kitwright: no cut run recorded the pieces of this unit.</p>
  return (
    <table className="w-full text-left text-base" aria-label="Pipe pieces">
      <thead className="border-b-2 border-stone-400">
        <tr>
          <th className="py-1 pr-3">Piece</th>
          <th className="py-1 pr-3">Length</th>
          <th className="py-1 pr-3">Cut run</th>
          <th className="py-1 pr-3">Stick</th>
          <th className="py-1 pr-3">Cut by</th>
        </tr>
      </thead>
      <tbody>
        {record.pieces.map((p, i) => (
          <tr key={i} className="border-b border-stone-200">
            <td className="py-1 pr-3">{p.label}</td>
            <td className="py-1 pr-3">{format(p.length)}</td>
            <td className="py-1 pr-3">{p.cutRunNumber}</td>
            <td className="py-1 pr-3">
              #{p.stickPosition}: {p.fromOffcut ? `offcut of ${p.partSku}` : `new ${p.partSku} stick, ${p.stickLength === null ? '' : format(p.stickLength)}`}
            </td>
            <td className="py-1 pr-3">{p.cutBy ? `${p.cutBy.name}, ${formatWhen(p.cutAt!)}` : 'not cut yet'}</td>
          </tr>
        ))}
      </tbody>
    </table>
  )
}
