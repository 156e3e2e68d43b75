import { execFileSync } from 'node:child_process'
import { mkdtempSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import path from 'node:path'
import { BarcodeFormat, BinaryBitmap, DecodeHintType, HybridBinarizer, MultiFormatReader, RGBLuminanceSource } from '@zxing/library'
import { PNG } from 'pngjs'

/** Renders every page of a PDF to PNG with poppler's pdftoppm at `dpi` (203 dpi: a common thermal printer). */
export function renderPdfPages(pdf: Buffer, dpi = 203): { pages: Buffer[]; dir: string } {
  const dir = mkdtempSync(path.join(tmpdir(), 'kw-pdf-'))
  writeFileSync(path.join(dir, 'in.pdf'), pdf)
  execFileSync('pdftoppm', ['-r', String(dpi), '-png', path.join(dir, 'in.pdf'), path.join(dir, 'page')])
  const files = readdirSync(dir).filter((f) => f.startsWith('page')).sort()
  return { pages: files.map((f) => readFileSync(path.join(dir, f))), dir }
}

export function removeDir(dir: string) {
  rmSync(dir, { recursive: true, force: true })
}

/**
 * Decodes a Code 128 (ISO/IEC 15417) from a PNG with ZXing (@zxing/library), a general-purpose
 * decoder independent of the bwip-js encoder that drew it.
 */
export function decodeCode128(png: Buffer, crop?: { x: number; y: number; w: number; h: number }): string {
  const img = PNG.sync.read(png)
  const box = crop ?? { x: 0, y: 0, w: img.width, h: img.height }
  const luminance = new Uint8ClampedArray(box.w * box.h)
  for (let y = 0; y < box.h; y++) {
    for (let x = 0; x < box.w; x++) {
      const i = ((box.y + y) * img.width + (box.x + x)) * 4
      luminance[y * box.w + x] = (img.data[i]! * 299 + img.data[i + 1]! * 587 + img.data[i + 2]! * 114) / 1000
    }
  }
  const reader = new MultiFormatReader()
  const hints = new Map<DecodeHintType, unknown>([
    [DecodeHintType.POSSIBLE_FORMATS, [BarcodeFormat.CODE_128]],
    [DecodeHintType.TRY_HARDER, true],
  ])
  reader.setHints(hints)
  return reader.decode(new BinaryBitmap(new HybridBinarizer(new RGBLuminanceSource(luminance, box.w, box.h)))).getText()
}

/** The size of a PNG in pixels. */
export function pngSize(png: Buffer) {
  const img = PNG.sync.read(png)
  return { width: img.width, height: img.height }
}
