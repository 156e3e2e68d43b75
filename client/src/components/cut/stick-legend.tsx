import { STICK_LEGEND, STICK_PALETTE as P } from '@kitwright/shared/stick-palette'
import { cn } from '../../lib/cn'

function Swatch({ kind }: { kind: (typeof STICK_LEGEND)[number]['key'] }) {
  return (
    <svg viewBox="0 0 32 20" className="h-5 w-8 shrink-0" aria-hidden="true">
      {kind === 'piece' && <rect x={1} y={1} width={30} height={18} fill={P.piece} stroke={P.pieceEdge} strokeWidth={2} />}
      {kind === 'next' && <rect x={2} y={2} width={28} height={16} fill={P.pieceNext} stroke={P.pieceInk} strokeWidth={3.5} />}
      {kind === 'cut' && <rect x={1} y={1} width={30} height={18} fill={P.pieceCut} stroke={P.pieceEdge} strokeWidth={2} />}
      {(kind === 'piece' || kind === 'next' || kind === 'cut') && (
        <text x={16} y={15} textAnchor="middle" fontSize={13} fontWeight={700} fill={kind === 'cut' ? P.pieceCutInk : P.pieceInk}>
          {kind === 'cut' ? '✓7' : '7'}
        </text>
      )}
      {kind === 'kerf' && <rect x={13} y={0} width={6} height={20} fill={P.kerf} />}
      {kind === 'trim' && <rect x={10} y={0} width={12} height={20} fill={P.trim} />}
      {kind === 'offcut' && <rect x={1} y={1} width={30} height={18} fill={P.offcut} stroke={P.offcutEdge} strokeWidth={2} strokeDasharray="6 3" />}
      {kind === 'scrap' && <rect x={1} y={1} width={30} height={18} fill={P.scrap} stroke={P.scrapEdge} strokeWidth={2} strokeDasharray="2 3" />}
    </svg>
  )
}

/** What the stick drawing's marks mean, in words beside the same swatches (bench adds next and cut). */
export function StickLegend({ bench = false, className }: { bench?: boolean; className?: string }) {
  return (
    <ul aria-label="Legend of the stick drawing" className={cn('flex flex-wrap gap-x-5 gap-y-1 text-sm text-stone-700', className)}>
      {STICK_LEGEND.filter((l) => bench || !l.benchOnly).map((l) => (
        <li key={l.key} className="flex items-center gap-2">
          <Swatch kind={l.key} />
          {l.words}
        </li>
      ))}
    </ul>
  )
}
