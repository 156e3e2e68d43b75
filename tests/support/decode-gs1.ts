import { BarcodeFormat, BinaryBitmap, DecodeHintType, HybridBinarizer, MultiFormatReader, RGBLuminanceSource } from '@zxing/library'
import { PNG } from 'pngjs'

/**
 * Reads a GS1-128 (a Code 128 starting with FNC1) from a region of a PNG with ZXing (@zxing/library),
 * a general-purpose decoder independent of the bwip-js encoder. With ZXing's ASSUME_GS1 hint a
 * leading FNC1 comes back as the symbology identifier `]C1`, so a plain Code 128 cannot pass for it.
 */
export function decodeGs1128(png: Buffer, box: { x: number; y: number; w: number; h: number }): string {
  const img = PNG.sync.read(png)
  const luminance = new Uint8ClampedArray(box.w * box.h)
  for (let y = 0; y < box.h; y++) {
    for (let x = 0; x < box.w; x++) {
      const i = ((box.y + y) * img.width + (box.x + x)) * 4
      luminance[y * box.w + x] = (img.data[i]! * 299 + img.data[i + 1]! * 587 + img.data[i + 2]! * 114) / 1000
    }
  }
  const hints = new Map<DecodeHintType, unknown>([
    [DecodeHintType.POSSIBLE_FORMATS, [BarcodeFormat.CODE_128]],
    [DecodeHintType.TRY_HARDER, true],
    [DecodeHintType.ASSUME_GS1, true],
  ])
  // The hints go with the call: decode() without them would reset them.
  return new MultiFormatReader().decode(new BinaryBitmap(new HybridBinarizer(new RGBLuminanceSource(luminance, box.w, box.h))), hints).getText()
}
