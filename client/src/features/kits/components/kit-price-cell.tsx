import { useState, type FormEvent } from 'react'
import { toast } from 'sonner'
import type { Kit } from '@kitwright/shared/kits'
import { dollarsToCents, formatMoney } from '@kitwright/shared/money'
import { Button } from '../../../components/ui/button'
import { Input } from '../../../components/ui/field'
import { ApiError } from '../../../lib/api-client'
import { useSetKitPrice } from '../api/kit-queries'

/** A kit's list price in the kits table, changed in place: type dollars, save; empty clears it. */
export function KitPriceCell({ kit }: { kit: Kit }) {
  const setPrice = useSetKitPrice()
  const [text, setText] = useState(kit.priceCents === null ? '' : (kit.priceCents / 100).toFixed(2))
  const [error, setError] = useState<string | null>(null)
  const submit = (e: FormEvent) => {
    e.preventDefault()
    const priceCents = text.trim() === '' ? null : dollarsToCents(text)
    if (priceCents !== null && Number.isNaN(priceCents)) return setError('Enter dollars and cents, e.g. 189.00')
    setError(null)
    setPrice.mutate(
      { kitId: kit.id, priceCents },
      {
        onSuccess: (k) => toast.success(`${k.sku}: list price ${k.priceCents === null ? 'cleared' : formatMoney(k.priceCents)}`),
        onError: (err) => setError(err instanceof ApiError ? err.message : 'Could not reach Kitwright; nothing was saved'),
      },
    )
  }
  return (
    <form onSubmit={submit} className="flex items-start gap-2" aria-label={`List price of ${kit.sku}`}>
      <div>
        <Input className="w-28" inputMode="decimal" placeholder="—" value={text} onChange={(e) => setText(e.target.value)} aria-label={`List price of ${kit.sku} ($)`} aria-invalid={!!error} />
        {error && (
          <span role="alert" className="block text-sm text-red-700">
            {error}
          </span>
        )}
      </div>
      <Button type="submit" variant="secondary" disabled={setPrice.isPending}>
        Save
      </Button>
    </form>
  )
}
