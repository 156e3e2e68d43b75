import { useEffect, useState } from 'react'
import { Input } from './field'

/**
 * A list's search box: typing waits a moment before it searches (so each key is not a request),
 * and the box follows the URL when it changes from outside (back button, a link).
 */
export function SearchField({ value, onSearch, placeholder }: { value: string | undefined; onSearch: (q: string | undefined) => void; placeholder: string }) {
  const [search, setSearch] = useState(value ?? '')
  useEffect(() => setSearch(value ?? ''), [value])
  useEffect(() => {
    if (search.trim() === (value ?? '')) return
    const timer = setTimeout(() => onSearch(search.trim() || undefined), 250)
    return () => clearTimeout(timer)
  }, [search, value, onSearch])
  return (
    <label className="block space-y-1">
      <span className="block text-sm font-bold text-stone-700">Search</span>
      <Input type="search" placeholder={placeholder} value={search} onChange={(e) => setSearch(e.target.value)} className="w-72" />
    </label>
  )
}
