import { useEffect, useRef, useState } from 'react'
import { cn } from '../../lib/cn'
import { takeEarlyScans } from '../../lib/early-scans'
import { CameraScanner } from './camera-scanner'
import { useScanQueue, type ScanHandler } from './use-scan-queue'

const NOT_TYPED = new Set(['checkbox', 'radio', 'button', 'submit', 'reset', 'file', 'image', 'range', 'color'])

/** The element that has focus takes typing (a text field, a list): leave focus with it. */
function typingElsewhere(input: HTMLInputElement): boolean {
  const active = document.activeElement
  if (active === input) return false
  if (active instanceof HTMLTextAreaElement || active instanceof HTMLSelectElement) return true
  return active instanceof HTMLInputElement && !NOT_TYPED.has(active.type)
}

/**
 * The bench scan field: a keyboard-wedge scanner types the code and presses Enter. The field is
 * never disabled and takes focus back after every scan and every action (a tap, a form sent), unless
 * the user is typing in another field; codes scanned while one is being handled wait their turn
 * (`useScanQueue`), so a quick second scan is never lost. Typing a code by hand and Enter works the
 * same. `onScan` may return a promise: the next code waits for it; if it rejects, the message is
 * shown under the field.
 */
export function ScanField({ label, onScan, className }: { label: string; onScan: ScanHandler; className?: string }) {
  const ref = useRef<HTMLInputElement>(null)
  const [value, setValue] = useState('')
  const scans = useScanQueue(onScan)
  useEffect(() => {
    const input = ref.current
    if (!input) return
    input.focus()
    // Codes scanned before the field was there to take them: the page was loading (lib/early-scans.ts).
    const early = takeEarlyScans()
    for (const code of early.codes) scans.enqueue(code)
    if (early.partial) setValue(early.partial)
    let timer: ReturnType<typeof setTimeout> | undefined
    // Give the tap or the form's own handler a moment to land; without scrolling, so a tap lower
    // on the page does not jump it to the top mid-tap.
    const refocus = (force: boolean) => () => {
      clearTimeout(timer)
      timer = setTimeout(() => {
        if (!input.isConnected) return
        if (force || !typingElsewhere(input)) input.focus({ preventScroll: true })
      }, 0)
    }
    const onBlur = refocus(false)
    const onSubmit = refocus(true)
    // A wedge scanner can start typing before focus came back (the page still settling): a key
    // pressed with nothing else taking typing moves focus here first, so the key lands in the field.
    const onKeyDown = (e: KeyboardEvent) => {
      if (e.ctrlKey || e.metaKey || e.altKey || e.key.length !== 1) return
      if (document.activeElement !== input && !typingElsewhere(input)) input.focus({ preventScroll: true })
    }
    input.addEventListener('blur', onBlur)
    document.addEventListener('click', onBlur)
    document.addEventListener('submit', onSubmit)
    document.addEventListener('keydown', onKeyDown, true)
    return () => {
      early.release()
      clearTimeout(timer)
      input.removeEventListener('blur', onBlur)
      document.removeEventListener('click', onBlur)
      document.removeEventListener('submit', onSubmit)
      document.removeEventListener('keydown', onKeyDown, true)
    }
    // Once, as the field appears; `enqueue` never changes.
  }, [])
  // Each handled scan may change the page around the field: take focus back once it settles.
  useEffect(() => {
    const input = ref.current
    if (input && !scans.busy && !typingElsewhere(input)) input.focus({ preventScroll: true })
  }, [scans.busy])
  return (
    <div className={cn('space-y-2', className)}>
      <label className="block">
        <span className="mb-1 block text-lg font-bold">{label}</span>
        <input
          ref={ref}
          // Focus as the field appears, before the first paint: a scan right after the page opens lands.
          autoFocus
          value={value}
          autoComplete="off"
          autoCapitalize="characters"
          spellCheck={false}
          aria-busy={scans.busy}
          onChange={(e) => setValue(e.target.value)}
          onKeyDown={(e) => {
            if (e.key !== 'Enter') return
            e.preventDefault()
            // Read the field itself: a wedge scanner types faster than React renders.
            const code = e.currentTarget.value.trim()
            e.currentTarget.value = ''
            setValue('')
            if (code) scans.enqueue(code)
          }}
          className="h-16 w-full rounded-lg border-4 border-brand-600 bg-white px-4 font-mono text-2xl tracking-wider focus:outline-4 focus:outline-brand-600"
          placeholder="Scan or type a code, then Enter"
        />
      </label>
      {scans.busy && (
        <p aria-live="polite" className="text-lg text-stone-700">
          Working on the scan…{scans.waiting > 0 ? ` ${scans.waiting} more waiting` : ''}
        </p>
      )}
      {scans.error && (
        <p role="alert" className="rounded-lg border-4 border-red-700 bg-red-50 p-3 text-xl font-bold text-red-900">
          {scans.error}
        </p>
      )}
      <CameraScanner onScan={scans.enqueue} />
    </div>
  )
}
