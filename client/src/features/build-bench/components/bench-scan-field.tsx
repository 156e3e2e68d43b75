import { useEffect, useRef, useState } from 'react'
import { cn } from '../../../lib/cn'

/**
 * The build bench's scan field: a keyboard-wedge scanner types the code and presses Enter. Focus
 * comes back here whenever it leaves for something that takes no typing (a tapped button), so the
 * next scan never lands nowhere. It comes back without scrolling: a tap further down the page must
 * not send the page to the top between the finger going down and coming up.
 */
export function BenchScanField({ label, onScan, className }: { label: string; onScan: (code: string) => void; className?: string }) {
  const ref = useRef<HTMLInputElement>(null)
  const [value, setValue] = useState('')
  useEffect(() => {
    const input = ref.current
    if (!input) return
    input.focus()
    const refocus = () => {
      setTimeout(() => {
        const active = document.activeElement
        const typing = active instanceof HTMLInputElement || active instanceof HTMLTextAreaElement || active instanceof HTMLSelectElement
        if (!typing) input.focus({ preventScroll: true })
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
    <label className={cn('block', className)}>
      <span className="mb-1 block text-lg font-bold">{label}</span>
      <input
        ref={ref}
        value={value}
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
  )
}
