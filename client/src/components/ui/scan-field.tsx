import { useEffect, useRef, useState } from 'react'
import { cn } from '../../lib/cn'
import { CameraScanner } from './camera-scanner'

/**
 * The bench scan field: a keyboard-wedge scanner types the code and presses Enter. The field takes
 * focus back whenever it loses it to nothing else that takes typing, so a scan never lands nowhere;
 * typing a code by hand and pressing Enter works the same.
 */
export function ScanField({ label, onScan, disabled, className }: { label: string; onScan: (code: string) => void; disabled?: boolean; className?: string }) {
  const ref = useRef<HTMLInputElement>(null)
  const [value, setValue] = useState('')
  useEffect(() => {
    const input = ref.current
    if (!input) return
    input.focus()
    const refocus = () => {
      // Give the click a moment to land; leave focus alone when the user moved it to another field.
      setTimeout(() => {
        const active = document.activeElement
        const typing = active instanceof HTMLInputElement || active instanceof HTMLTextAreaElement || active instanceof HTMLSelectElement
        // Without scrolling: a tap lower on the page must not jump it to the top mid-tap.
        if (!typing && !input.disabled) input.focus({ preventScroll: true })
      }, 0)
    }
    input.addEventListener('blur', refocus)
    document.addEventListener('click', refocus)
    return () => {
      input.removeEventListener('blur', refocus)
      document.removeEventListener('click', refocus)
    }
  }, [])
  return (
    <div className={cn('space-y-2', className)}>
      <label className="block">
        <span className="mb-1 block text-lg font-bold">{label}</span>
        <input
          ref={ref}
          value={value}
          disabled={disabled}
          autoComplete="off"
          autoCapitalize="characters"
          spellCheck={false}
          onChange={(e) => setValue(e.target.value)}
          onKeyDown={(e) => {
            if (e.key !== 'Enter') return
            e.preventDefault()
            const code = value.trim()
            setValue('')
            if (code) onScan(code)
          }}
          className="h-16 w-full rounded-lg border-4 border-brand-600 bg-white px-4 font-mono text-2xl tracking-wider focus:outline-4 focus:outline-brand-600"
          placeholder="Scan or type a code, then Enter"
        />
      </label>
      {!disabled && <CameraScanner onScan={onScan} />}
    </div>
  )
}
