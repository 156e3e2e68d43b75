import { readFileSync } from 'node:fs'
import path from 'node:path'
import { describe, expect, it } from 'vitest'
import { STICK_PALETTE } from '@kitwright/shared/stick-palette'

const css = readFileSync(path.resolve(import.meta.dirname, '../../index.css'), 'utf8')
const token = (name: string) => new RegExp(`--color-${name}:\\s*(#[0-9a-f]{6})`, 'i').exec(css)?.[1]?.toLowerCase()
const kebab = (s: string) => s.replace(/[A-Z]/g, (c) => `-${c.toLowerCase()}`)

/** WCAG 2.2, "relative luminance" and "contrast ratio" definitions (sRGB). */
function luminance(hex: string) {
  const [r, g, b] = [1, 3, 5].map((i) => {
    const c = parseInt(hex.slice(i, i + 2), 16) / 255
    return c <= 0.04045 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4
  })
  return 0.2126 * r! + 0.7152 * g! + 0.0722 * b!
}
function contrast(a: string, b: string) {
  const [hi, lo] = [luminance(a), luminance(b)].sort((x, y) => y - x)
  return (hi! + 0.05) / (lo! + 0.05)
}

describe('the stick palette', () => {
  it('is the app theme: every colour is a --color-stick-* token of index.css, and the piece colours are the brand greens', () => {
    for (const [name, hex] of Object.entries(STICK_PALETTE)) expect(token(`stick-${kebab(name)}`), name).toBe(hex)
    expect(STICK_PALETTE.piece).toBe(token('brand-50'))
    expect(STICK_PALETTE.pieceEdge).toBe(token('brand-700'))
    expect(STICK_PALETTE.pieceCut).toBe(token('brand-600'))
    expect(STICK_PALETTE.pieceInk).toBe(token('brand-900'))
  })

  it('keeps the numbers readable on every fill (WCAG 2.2 contrast of at least 4.5:1 for text)', () => {
    const p = STICK_PALETTE
    for (const [ink, fill] of [[p.pieceInk, p.piece], [p.pieceInk, p.pieceNext], [p.pieceCutInk, p.pieceCut], [p.ink, p.offcut], [p.ink, p.scrap], [p.ink, p.pieceMoved]] as const) {
      expect(contrast(ink, fill), `${ink} on ${fill}`).toBeGreaterThanOrEqual(4.5)
    }
  })
})
