import { useCallback, type ReactNode } from 'react'
import { Select } from './field'
import { SearchField } from './search-field'

/**
 * The row above a server-paged list: the search box, then the list's own filters. Every change
 * goes to the URL and back to page 1 (the caller's `onQueryChange` gets `page: 1` with it).
 */
export function FilterBar<Q extends { q?: string; page?: number }>({ query, onQueryChange, placeholder, children }: {
  query: Q
  onQueryChange: (change: Partial<Q>) => void
  placeholder: string
  children?: ReactNode
}) {
  const onSearch = useCallback((q: string | undefined) => onQueryChange({ q, page: 1 } as Partial<Q>), [onQueryChange])
  return (
    <div className="flex flex-wrap items-end gap-3">
      <SearchField value={query.q} onSearch={onSearch} placeholder={placeholder} />
      {children}
    </div>
  )
}

/** A labelled drop-down of a filter bar; the empty choice (`anyLabel`) means "no filter". */
export function FilterSelect({ label, value, onChange, options, anyLabel, className }: {
  label: string
  value: string
  onChange: (value: string) => void
  options: readonly { value: string; label: string }[]
  anyLabel?: string
  className?: string
}) {
  return (
    <label className="block space-y-1">
      <span className="block text-sm font-bold text-stone-700">{label}</span>
      <Select value={value} onChange={(e) => onChange(e.target.value)} className={className}>
        {anyLabel !== undefined && <option value="">{anyLabel}</option>}
        {options.map((o) => (
          <option key={o.value} value={o.value}>
            {o.label}
          </option>
        ))}
      </Select>
    </label>
  )
}

/** A tick box of a filter bar ("Late only", "Low stock only"). */
export function FilterCheck({ label, checked, onChange }: { label: string; checked: boolean; onChange: (checked: boolean) => void }) {
  return (
    <label className="flex h-11 items-center gap-2 self-end font-bold text-stone-700">
      <input type="checkbox" className="size-5 accent-brand-700" checked={checked} onChange={(e) => onChange(e.target.checked)} />
      {label}
    </label>
  )
}
