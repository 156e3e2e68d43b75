import { readScaleLine } from '@kitwright/shared/domain/bag-weight'

/** The little of the Web Serial API the scale reader uses (Chromium-based browsers; not in TypeScript's DOM types). */
interface SerialPortLike {
  open(options: { baudRate: number }): Promise<void>
  close(): Promise<void>
  readable: ReadableStream<Uint8Array> | null
}
interface SerialLike {
  requestPort(): Promise<SerialPortLike>
}

function serialApi(): SerialLike | null {
  const nav = navigator as Navigator & { serial?: SerialLike }
  return nav.serial ?? null
}

/** Whether this browser can read a USB scale (Web Serial API); typed entry works everywhere. */
export function scaleReadingSupported(): boolean {
  return typeof navigator !== 'undefined' && serialApi() !== null
}

/**
 * Asks the person to choose the scale's port, then reads its lines until one carries a steady weight
 * (9600 baud, a common default of bench scales: check the scale's manual). Returns the reading in grams as
 * text, e.g. `127.4 g`, for the same parser as typed entry.
 */
export async function readSteadyWeight(signal: AbortSignal, baudRate = 9600): Promise<string> {
  const serial = serialApi()
  if (!serial) throw new Error('This browser cannot read a scale: type the weight')
  const port = await serial.requestPort()
  await port.open({ baudRate })
  const reader = port.readable?.pipeThrough(new TextDecoderStream() as unknown as ReadableWritablePair<string, Uint8Array>).getReader()
  if (!reader) {
    await port.close()
    throw new Error('The scale sends nothing: check its cable and that it is switched on')
  }
  const stop = () => void reader.cancel()
  signal.addEventListener('abort', stop)
  let buffer = ''
  try {
    for (;;) {
      const { value, done } = await reader.read()
      if (done) throw new Error('The scale stopped before a steady reading: weigh again or type the weight')
      buffer += value
      const lines = buffer.split(/\r?\n|\r/)
      buffer = lines.pop() ?? ''
      for (const line of lines) {
        const reading = readScaleLine(line)
        if (reading?.stable) return `${Number((reading.mg / 1000).toFixed(3))} g`
      }
    }
  } finally {
    signal.removeEventListener('abort', stop)
    reader.releaseLock()
    await port.close()
  }
}
