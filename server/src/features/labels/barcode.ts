import bwipjs from 'bwip-js/node'

/**
 * A Code 128 barcode as a PNG: white background and a quiet zone (padding) so that scanners and
 * decoders find it; bwip-js draws transparent with no quiet zone unless told.
 */
export function code128Png(text: string, heightMm = 10): Promise<Buffer> {
  return bwipjs.toBuffer({ bcid: 'code128', text, scale: 4, height: heightMm, includetext: false, backgroundcolor: 'FFFFFF', padding: 10 })
}
