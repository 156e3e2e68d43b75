import type { CutStick } from '@kitwright/shared/cut-runs'
import { placeUnderLabels } from '@kitwright/shared/stick-labels'
import { STICK_PALETTE as P } from '@kitwright/shared/stick-palette'

const W = 1000
const BAR = 64
const LEVEL = 26
const NUMBER_SIZE = 20
/** Roboto Condensed's figures are about half an em wide; enough to decide inside or under. */
const numberWidth = (text: string) => text.length * NUMBER_SIZE * 0.52

interface Mark {
  x: number
  w: number
  number: string
  level: number | null
}

/** Where every piece's number goes: inside when it fits, else in a row under the stick (as on the cut sheet). */
function layoutMarks(stick: CutStick, k: number, width: number): { marks: Mark[]; levels: number } {
  const marks = stick.cuts.map((c, i): Mark => {
    const w = c.length * k
    const number = String(i + 1)
    return { x: c.offset * k, w, number, level: numberWidth(number) + 6 <= w ? null : -1 }
  })
  const under = marks.filter((m) => m.level !== null)
  const levels = placeUnderLabels(
    under.map((m) => ({ cx: m.x + m.w / 2, half: numberWidth(m.number) / 2 + 3 })),
    { leaderHalf: 1, maxLevels: 4, min: 0, max: width },
  )
  under.forEach((m, i) => (m.level = levels[i]!))
  return { marks, levels: under.length > 0 ? Math.max(...levels) + 1 : 0 }
}

/**
 * One stick drawn to scale in Kitwright's palette (shared/stick-palette.ts, the same as the cut
 * sheet): the end trim as a dark band, each piece numbered as its row in the cut list, a dark slot
 * for each saw cut, and the remnant as an offcut (honey, dashed) or scrap (white, dotted), in
 * words when there is room. Narrow pieces get their number under the stick on a leader line.
 * Every stick of a run shares `scaleLength` so lengths compare at a glance.
 */
export function StickDrawing({ stick, kerf, scaleLength, format, highlightCutId }: { stick: CutStick; kerf: number; scaleLength: number; format: (v: number) => string; highlightCutId?: string }) {
  const k = W / scaleLength
  const width = stick.length * k
  const { marks, levels } = layoutMarks(stick, k, width)
  const H = BAR + (levels > 0 ? 8 + levels * LEVEL : 4)
  const remnantX = (stick.length - stick.remnant) * k
  const remnantW = stick.remnant * k
  const remnantWords = `${stick.remnantIsOffcut ? 'offcut' : 'scrap'} ${format(stick.remnant)}`
  const what = stick.source === 'offcut' ? `Offcut ${stick.sourceOffcutCode}` : 'Stick'
  const cutWords = stick.cuts.map((c, i) => `${i + 1}. ${format(c.length)} for ${c.serial}${c.status === 'cut' ? ' (cut)' : ''}`).join(', ')
  const label = `${what} of ${format(stick.length)}: ${cutWords}${stick.remnant > 0 ? `; ${remnantWords}` : ''}`
  return (
    <svg viewBox={`0 0 ${W} ${H}`} className="h-auto w-full" role="img" aria-label={label} preserveAspectRatio="xMinYMin meet" fontFamily="inherit">
      <rect x={1} y={1} width={width - 2} height={BAR - 2} fill={P.scrap} stroke={P.edge} strokeWidth={2} />
      {stick.trim > 0 && (
        <rect x={0} y={0} width={Math.max(3, stick.trim * k)} height={BAR} fill={P.trim}>
          <title>End trim {format(stick.trim)}</title>
        </rect>
      )}
      {stick.cuts.map((c, i) => {
        const m = marks[i]!
        const done = c.status === 'cut'
        const moved = c.status === 'replanned'
        const next = c.id === highlightCutId
        const fill = moved ? P.pieceMoved : done ? P.pieceCut : next ? P.pieceNext : P.piece
        const ink = done ? P.pieceCutInk : moved ? P.ink : P.pieceInk
        const cx = m.x + m.w / 2
        // Length (and serial) under the number when the piece is wide enough; 15-unit type is about 7.5 wide a letter.
        const lengthText = format(c.length)
        const showLength = m.level === null && m.w >= lengthText.length * 7.5 + 8
        const showSerial = m.w >= (lengthText.length + c.serial.length + 3) * 7.5 + 8
        return (
          <g key={c.id}>
            <rect
              x={m.x}
              y={next ? 2 : 0}
              width={m.w}
              height={next ? BAR - 4 : BAR}
              fill={fill}
              stroke={next ? P.pieceInk : P.pieceEdge}
              strokeWidth={next ? 5 : 2}
              strokeDasharray={moved ? '6 4' : undefined}
            />
            {kerf > 0 && <rect x={m.x + m.w} y={0} width={Math.max(2.5, kerf * k)} height={BAR} fill={P.kerf} />}
            {m.level === null ? (
              <>
                <text x={cx} y={showLength ? 28 : 40} textAnchor="middle" fontSize={NUMBER_SIZE} fontWeight={700} fill={ink}>
                  {done && m.w > numberWidth(m.number) + 22 ? `✓${m.number}` : m.number}
                </text>
                {showLength && (
                  <text x={cx} y={52} textAnchor="middle" fontSize={15} fill={ink}>
                    {showSerial ? `${lengthText} · ${c.serial}` : lengthText}
                  </text>
                )}
              </>
            ) : null}
            <title>{`${m.number}. ${format(c.length)} ${c.label} for work order ${c.serial}${done ? ' (cut)' : moved ? ' (moved by re-plan)' : ''}`}</title>
          </g>
        )
      })}
      {/* Leaders first, then the numbers on a paper-white halo, so no leader runs over a number. */}
      {marks.map((m) =>
        m.level === null ? null : <line key={`l${m.number}`} x1={m.x + m.w / 2} y1={BAR} x2={m.x + m.w / 2} y2={BAR + 6 + m.level * LEVEL} stroke={P.pieceEdge} strokeWidth={1.5} />,
      )}
      {marks.map((m) =>
        m.level === null ? null : (
          <text
            key={`n${m.number}`}
            x={m.x + m.w / 2}
            y={BAR + 4 + (m.level + 1) * LEVEL}
            textAnchor="middle"
            fontSize={NUMBER_SIZE}
            fontWeight={700}
            fill={P.pieceInk}
            stroke={P.scrap}
            strokeWidth={5}
            paintOrder="stroke"
          >
            {m.number}
          </text>
        ),
      )}
      {stick.remnant > 0 && (
        <g>
          <rect
            x={remnantX + 2}
            y={2}
            width={Math.max(1, remnantW - 4)}
            height={BAR - 4}
            fill={stick.remnantIsOffcut ? P.offcut : P.scrap}
            stroke={stick.remnantIsOffcut ? P.offcutEdge : P.scrapEdge}
            strokeWidth={2}
            strokeDasharray={stick.remnantIsOffcut ? '10 5' : '2 4'}
          />
          {remnantW > remnantWords.length * 9 && (
            <text x={remnantX + remnantW / 2} y={40} textAnchor="middle" fontSize={18} fill={P.ink}>
              {remnantWords}
            </text>
          )}
          <title>{remnantWords}</title>
        </g>
      )}
    </svg>
  )
}
