import { lazy, Suspense } from 'react'

const CameraScannerView = lazy(() => import('./camera-scanner-view').then((m) => ({ default: m.CameraScanner })))

/** The browser has a barcode reader and a camera (a secure context on a phone or tablet). */
function canScanWithCamera(): boolean {
  return 'BarcodeDetector' in window && typeof navigator.mediaDevices?.getUserMedia === 'function'
}

/**
 * Camera scanning, for a bench without a handheld scanner (see `camera-scanner-view.tsx`). Its code
 * is fetched only on a browser that can scan with a camera, so a bench PC with a keyboard-wedge
 * scanner never downloads it.
 */
export function CameraScanner({ onScan }: { onScan: (code: string) => void }) {
  if (!canScanWithCamera()) return null
  return (
    <Suspense fallback={null}>
      <CameraScannerView onScan={onScan} />
    </Suspense>
  )
}
