import { forwardRef, type InputHTMLAttributes, type ReactNode, type SelectHTMLAttributes } from 'react'
import { cn } from '../../lib/cn'

const control =
  'h-11 w-full rounded-md border border-stone-300 bg-white px-3 text-base focus:border-brand-600 focus:outline-2 focus:outline-brand-600 aria-invalid:border-red-600'

export const Input = forwardRef<HTMLInputElement, InputHTMLAttributes<HTMLInputElement>>(function Input({ className, ...props }, ref) {
  return <input ref={ref} className={cn(control, className)} {...props} />
})

export const Select = forwardRef<HTMLSelectElement, SelectHTMLAttributes<HTMLSelectElement>>(function Select({ className, ...props }, ref) {
  return <select ref={ref} className={cn(control, className)} {...props} />
})

/** A label, its control and the message that says what to fix. */
export function Field({ label, error, children, hint }: { label: string; error?: string; hint?: string; children: ReactNode }) {
  return (
    <label className="block space-y-1">
      <span className="block text-sm font-bold text-stone-700">{label}</span>
      {children}
      {hint && !error && <span className="block text-sm text-stone-500">{hint}</span>}
      {error && (
        <span role="alert" className="block text-sm text-red-700">
          {error}
        </span>
      )}
    </label>
  )
}
