import type { CutStick } from '@kitwright/shared/cut-runs'

/**
 * One stick drawn to scale: the squaring trim (grey), each piece with its length and work order
 * serial, the kerf after each cut (red), and the remnant marked as an offcut to keep (green) or waste
 * (hatched red). Every stick of a run shares `scaleLength` so lengths compare at a glance.
 */
export function StickDrawing({ stick, kerf, scaleLength, format, highlightCutId }: { stick: CutStick; kerf: number; scaleLength: number; format: (v: number) => string; highlightCutId?: string }) {
  const W = 1000
  const H = 64
  const k = W / scaleLength
  const width = stick.length * k
  const remnantX = (stick.length - stick.remnant) * k
  const label = `${stick.source === 'offcut' ? `Offcut ${stick.sourceOffcutCode}` : 'Stick'} of ${format(stick.length)}: ${stick.cuts.map((c) => `${format(c.length)} for ${c.serial}`).join(', ')}${stick.remnant > 0 ? `; ${stick.remnantIsOffcut ? 'offcut' : 'waste'} ${format(stick.remnant)}` : ''}`
  return (
    <svg viewBox={`0 0 ${W} ${H}`} className="h-16 w-full" role="img" aria-label={label} preserveAspectRatio="none">
      <defs>
        <pattern id="kw-waste" width="8" height="8" patternUnits="userSpaceOnUse" patternTransform="rotate(45)">
          <rect width="8" height="8" fill="#fee2e2" />
          <line x1="0" y1="0" x2="0" y2="8" stroke="#dc2626" strokeWidth="3" />
        </pattern>
      </defs>
      <rect x={0} y={0} width={width} height={H} fill="#f5f5f4" stroke="#44403c" strokeWidth={1.5} />
      {stick.trim > 0 && <rect x={0} y={0} width={Math.max(2, stick.trim * k)} height={H} fill="#a8a29e"><title>Trim {format(stick.trim)}</title></rect>}
      {stick.cuts.map((c) => {
        const x = (stick.trim + c.offset) * k
        const w = c.length * k
        const done = c.status === 'cut'
        const moved = c.status === 'replanned'
        return (
          <g key={c.id}>
            <rect x={x} y={0} width={w} height={H} fill={moved ? '#e7e5e4' : done ? '#bbf7d0' : c.id === highlightCutId ? '#fde68a' : '#dbeafe'} stroke="#1e3a8a" strokeWidth={1} />
            {kerf > 0 && <rect x={x + w} y={0} width={Math.max(1.5, kerf * k)} height={H} fill="#b91c1c" />}
            {w > 44 && (
              <>
                <text x={x + w / 2} y={26} textAnchor="middle" fontSize={18} fontWeight={700} fill="#111827">
                  {format(c.length)}
                </text>
                <text x={x + w / 2} y={50} textAnchor="middle" fontSize={16} fill="#374151">
                  {c.serial}
                </text>
              </>
            )}
            <title>{`${format(c.length)} ${c.label} for work order ${c.serial}${done ? ' (cut)' : moved ? ' (moved by re-plan)' : ''}`}</title>
          </g>
        )
      })}
      {stick.remnant > 0 && (
        <g>
          <rect x={remnantX} y={0} width={stick.remnant * k} height={H} fill={stick.remnantIsOffcut ? '#dcfce7' : 'url(#kw-waste)'} stroke="#44403c" strokeWidth={1} />
          {stick.remnant * k > 70 && (
            <text x={remnantX + (stick.remnant * k) / 2} y={38} textAnchor="middle" fontSize={16} fill="#14532d">
              {stick.remnantIsOffcut ? `offcut ${format(stick.remnant)}` : `waste ${format(stick.remnant)}`}
            </text>
          )}
        </g>
      )}
    </svg>
  )
}
