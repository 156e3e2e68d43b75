import { useEffect, useRef, useState } from 'react'
import { Button } from './button'

interface DetectedBarcode {
  rawValue: string
}
interface BarcodeDetectorLike {
  detect(source: HTMLVideoElement): Promise<DetectedBarcode[]>
}
type BarcodeDetectorCtor = new (options: { formats: string[] }) => BarcodeDetectorLike

function detectorCtor(): BarcodeDetectorCtor | null {
  const ctor = (window as unknown as { BarcodeDetector?: BarcodeDetectorCtor }).BarcodeDetector
  return ctor && typeof navigator.mediaDevices?.getUserMedia === 'function' ? ctor : null
}

/**
 * Camera scanning, for a bench without a handheld scanner: the browser's own barcode reader
 * (BarcodeDetector) on the rear camera. Shown only where the browser has one.
 */
export function CameraScanner({ onScan }: { onScan: (code: string) => void }) {
  const [open, setOpen] = useState(false)
  const [error, setError] = useState<string | null>(null)
  const video = useRef<HTMLVideoElement>(null)
  // The latest handler, without restarting the camera each time the parent renders.
  const handler = useRef(onScan)
  handler.current = onScan
  const Detector = detectorCtor()

  useEffect(() => {
    if (!open || !Detector) return
    let stream: MediaStream | null = null
    let stopped = false
    const detector = new Detector({ formats: ['code_128', 'qr_code'] })
    void (async () => {
      try {
        stream = await navigator.mediaDevices.getUserMedia({ video: { facingMode: 'environment' } })
        if (!video.current || stopped) return
        video.current.srcObject = stream
        await video.current.play()
        while (!stopped) {
          const [found] = await detector.detect(video.current)
          if (found?.rawValue) {
            handler.current(found.rawValue)
            setOpen(false)
            return
          }
          await new Promise((r) => setTimeout(r, 200))
        }
      } catch {
        setError('The camera could not be opened; allow camera access or use the scanner')
        setOpen(false)
      }
    })()
    return () => {
      stopped = true
      stream?.getTracks().forEach((t) => t.stop())
    }
  }, [open, Detector])

  if (!Detector) return null
  return (
    <div className="space-y-2">
      <Button variant="secondary" size="bench" onClick={() => setOpen((o) => !o)}>
        {open ? 'Close the camera' : 'Scan with the camera'}
      </Button>
      {open && <video ref={video} className="w-full max-w-md rounded-lg border border-stone-300" muted playsInline />}
      {error && <p role="alert" className="text-red-700">{error}</p>}
    </div>
  )
}
