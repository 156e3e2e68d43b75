/**
 * Kitwright's own look for a stick drawn to scale, shared by the screens (SVG) and the cut sheet
 * (PDF). The colours are the app's theme tokens (`--color-stick-*` in client/src/index.css, built
 * on the brand greens and Tailwind's stone and amber); a unit test keeps the two in step. No part
 * is told apart by colour alone: pieces carry their cut number and a solid outline, kerfs are
 * narrow dark slots, the trim is a dark band at the start, the offcut has a dashed outline and
 * the word "offcut", scrap a dotted outline and the word "scrap".
 */
export const STICK_PALETTE = {
  /** A piece to cut: pale brand green with a brand outline and its number in brand ink. */
  piece: '#eef7f2',
  pieceEdge: '#17603e',
  pieceInk: '#0d3523',
  /** The piece the cutter takes next (bench): a stronger green and a thicker outline. */
  pieceNext: '#a9d8bd',
  /** A piece already ticked: solid brand green, white number, a tick mark. */
  pieceCut: '#1f7a4f',
  pieceCutInk: '#ffffff',
  /** A piece moved to another stick by a re-plan. */
  pieceMoved: '#e7e5e4',
  /** The saw's width at each cut. */
  kerf: '#0d3523',
  /** The squaring cut at the start of a new stick. */
  trim: '#57534e',
  /** A remnant kept as an offcut: honey with a dashed outline. */
  offcut: '#fde68a',
  offcutEdge: '#92400e',
  /** A remnant too short to keep: paper white with a dotted outline. */
  scrap: '#ffffff',
  scrapEdge: '#78716c',
  /** The stick's outline and the text around it. */
  edge: '#292524',
  ink: '#1c1917',
} as const

/** A colour of the stick palette. */
export type StickColour = keyof typeof STICK_PALETTE

/** The legend printed beside every stick drawing, in words, with what each swatch looks like. */
export const STICK_LEGEND: readonly { key: 'piece' | 'next' | 'cut' | 'kerf' | 'trim' | 'offcut' | 'scrap'; words: string; benchOnly?: boolean }[] = [
  { key: 'piece', words: 'Piece: its number is its row in the cut list' },
  { key: 'next', words: 'Next piece to cut', benchOnly: true },
  { key: 'cut', words: 'Cut and ticked', benchOnly: true },
  { key: 'kerf', words: 'Saw cut (kerf)' },
  { key: 'trim', words: 'End trim: square the end first' },
  { key: 'offcut', words: 'Offcut: label it, to the rack' },
  { key: 'scrap', words: 'Scrap: too short to keep' },
]
