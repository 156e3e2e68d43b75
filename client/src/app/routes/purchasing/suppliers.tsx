import { useQuery } from '@tanstack/react-query'
import { useState } from 'react'
import { toast } from 'sonner'
import { dollarsToCents, formatMoney } from '@kitwright/shared/money'
import type { PriceBreak, Supplier } from '@kitwright/shared/purchasing'
import { Button } from '../../../components/ui/button'
import { Field, Input, Select } from '../../../components/ui/field'
import { suppliersOptions, useSaveSupplier, useSaveSupplierPart } from '../../../features/purchasing/api/purchasing-queries'
import { stockPartOptions } from '../../../features/stock/api/stock-queries'
import { ApiError } from '../../../lib/api-client'

const th = 'px-3 py-2 font-bold'

function errorText(err: unknown) {
  return err instanceof ApiError ? err.message : 'Could not reach Kitwright; check the connection and try again'
}

/** Price breaks as the office reads and types them: `1 @ 10.00; 10 @ 9.00`. */
function breaksText(breaks: PriceBreak[]) {
  return breaks.map((b) => `${b.minQuantity} @ ${(b.unitPriceCents / 100).toFixed(2)}`).join('; ')
}

/** Reads `1 @ 10.00; 10 @ 9.00`; a piece that cannot be read is kept as NaN so the server names it. */
function parseBreaks(text: string): PriceBreak[] {
  return text
    .split(';')
    .map((p) => p.trim())
    .filter((p) => p !== '')
    .map((p) => {
      const [qty, price = ''] = p.split('@').map((x) => x.trim())
      const cents = price.startsWith('-') ? Math.round(Number(price) * 100) : dollarsToCents(price)
      return { minQuantity: Number(qty), unitPriceCents: cents }
    })
}

interface SupplierDraft {
  name: string
  contactName: string
  email: string
  phone: string
  leadTimeDays: string
  minimum: string
}

const EMPTY: SupplierDraft = { name: '', contactName: '', email: '', phone: '', leadTimeDays: '', minimum: '0.00' }

function toDraft(s: Supplier): SupplierDraft {
  return {
    name: s.name,
    contactName: s.contactName ?? '',
    email: s.email ?? '',
    phone: s.phone ?? '',
    leadTimeDays: s.leadTimeDays === null ? '' : String(s.leadTimeDays),
    minimum: (s.minimumOrderCents / 100).toFixed(2),
  }
}

/** Suppliers: who the shop buys from, their terms, and per part their SKU, pack and price breaks. */
export function Component() {
  const suppliers = useQuery(suppliersOptions())
  const [editing, setEditing] = useState<string | 'new' | null>(null)
  return (
    <div className="space-y-4">
      <div className="flex flex-wrap items-end gap-3">
        <div className="mr-auto">
          <h1 className="text-3xl font-bold">Suppliers</h1>
          <p className="max-w-3xl text-stone-700">
            Who the shop buys parts from. Drafts from shortages go to each part's supplier, rounded up to the pack size and to the supplier's minimum
            order, and priced by the price breaks.
          </p>
        </div>
        <Button onClick={() => setEditing('new')}>Add a supplier</Button>
      </div>
      {editing === 'new' && <SupplierForm supplier={null} onDone={() => setEditing(null)} />}
      {suppliers.isError && <p role="alert">{suppliers.error.message}</p>}
      {(suppliers.data ?? []).map((s) =>
        editing === s.id ? (
          <SupplierForm key={s.id} supplier={s} onDone={() => setEditing(null)} />
        ) : (
          <SupplierCard key={s.id} supplier={s} onEdit={() => setEditing(s.id)} />
        ),
      )}
    </div>
  )
}

function SupplierCard({ supplier: s, onEdit }: { supplier: Supplier; onEdit: () => void }) {
  return (
    <section aria-label={s.name} className="space-y-3 rounded-lg border border-stone-300 bg-white p-4">
      <div className="flex flex-wrap items-start gap-3">
        <div className="mr-auto">
          <h2 className="text-xl font-bold">{s.name}</h2>
          <p className="text-stone-700">
            {[s.contactName, s.email, s.phone].filter(Boolean).join(' · ') || 'No contact yet'}
            {' · '}
            {s.leadTimeDays !== null ? `${s.leadTimeDays} days lead time` : 'lead time not set'}
            {' · '}
            minimum order {formatMoney(s.minimumOrderCents)}
          </p>
        </div>
        <Button variant="secondary" size="sm" onClick={onEdit}>
          Edit {s.name}
        </Button>
      </div>
      <table className="w-full text-left" aria-label={`Parts from ${s.name}`}>
        <thead className="bg-stone-50 text-sm text-stone-600">
          <tr>
            <th className={th}>Part</th>
            <th className={th}>Their SKU</th>
            <th className={th}>Pack</th>
            <th className={th}>Price breaks (from quantity @ unit price)</th>
          </tr>
        </thead>
        <tbody>
          {s.parts.map((p) => (
            <tr key={p.partId} className="border-t border-stone-200">
              <td className="px-3 py-2">
                <span className="font-bold">{p.sku}</span> {p.name}
                {p.preferred ? '' : <span className="block text-sm text-stone-600">Bought elsewhere by default</span>}
              </td>
              <td className="px-3 py-2">{p.supplierSku ?? '—'}</td>
              <td className="px-3 py-2 tabular-nums">{p.packSize}</td>
              <td className="px-3 py-2 tabular-nums">{p.priceBreaks.map((b) => `${b.minQuantity}+ @ ${formatMoney(b.unitPriceCents)}`).join(' · ')}</td>
            </tr>
          ))}
          {s.parts.length === 0 && (
            <tr>
              <td colSpan={4} className="px-3 py-4 text-stone-500">
                No parts yet: edit the supplier to add what they sell.
              </td>
            </tr>
          )}
        </tbody>
      </table>
    </section>
  )
}

function SupplierForm({ supplier, onDone }: { supplier: Supplier | null; onDone: () => void }) {
  const save = useSaveSupplier()
  const [draft, setDraft] = useState<SupplierDraft>(supplier ? toDraft(supplier) : EMPTY)
  const [errors, setErrors] = useState<Record<string, string>>({})
  const set = (k: keyof SupplierDraft) => (e: React.ChangeEvent<HTMLInputElement>) => setDraft({ ...draft, [k]: e.target.value })
  const submit = () => {
    setErrors({})
    const minimum = draft.minimum.trim().startsWith('-') ? Math.round(Number(draft.minimum) * 100) : dollarsToCents(draft.minimum || '0')
    save.mutate(
      {
        id: supplier?.id ?? null,
        input: {
          name: draft.name,
          contactName: draft.contactName,
          email: draft.email,
          phone: draft.phone,
          leadTimeDays: draft.leadTimeDays.trim() === '' ? null : Number(draft.leadTimeDays),
          minimumOrderCents: minimum,
          active: supplier?.active ?? true,
        },
      },
      {
        onSuccess: (s) => {
          toast.success(`${s.name} saved`)
          if (!supplier) onDone()
        },
        onError: (err) => {
          if (err instanceof ApiError) setErrors(err.body.fields ?? {})
          toast.error(errorText(err))
        },
      },
    )
  }
  return (
    <section aria-label={supplier ? `Edit ${supplier.name}` : 'New supplier'} className="space-y-4 rounded-lg border border-brand-700 bg-white p-4">
      <h2 className="text-xl font-bold">{supplier ? `Edit ${supplier.name}` : 'New supplier'}</h2>
      <div className="grid gap-3 md:grid-cols-3">
        <Field label="Name" error={errors.name}>
          <Input value={draft.name} onChange={set('name')} />
        </Field>
        <Field label="Contact name" error={errors.contactName}>
          <Input value={draft.contactName} onChange={set('contactName')} />
        </Field>
        <Field label="E-mail (purchase orders go here)" error={errors.email}>
          <Input type="email" value={draft.email} onChange={set('email')} />
        </Field>
        <Field label="Phone" error={errors.phone}>
          <Input value={draft.phone} onChange={set('phone')} />
        </Field>
        <Field label="Lead time (days)" error={errors.leadTimeDays}>
          <Input inputMode="numeric" value={draft.leadTimeDays} onChange={set('leadTimeDays')} />
        </Field>
        <Field label="Minimum order ($)" error={errors.minimumOrderCents}>
          <Input inputMode="decimal" value={draft.minimum} onChange={set('minimum')} />
        </Field>
      </div>
      <div className="flex gap-3">
        <Button disabled={save.isPending} onClick={submit}>
          Save the supplier
        </Button>
        <Button variant="ghost" onClick={onDone}>
          Done
        </Button>
      </div>
      {supplier && <SupplierPartsEditor supplier={supplier} />}
    </section>
  )
}

function SupplierPartsEditor({ supplier }: { supplier: Supplier }) {
  const parts = useQuery(stockPartOptions())
  const save = useSaveSupplierPart()
  const [partId, setPartId] = useState('')
  const [supplierSku, setSupplierSku] = useState('')
  const [packSize, setPackSize] = useState('1')
  const [breaks, setBreaks] = useState('1 @ 0.00')
  const [errors, setErrors] = useState<Record<string, string>>({})
  const pick = (id: string) => {
    setPartId(id)
    const known = supplier.parts.find((p) => p.partId === id)
    setSupplierSku(known?.supplierSku ?? '')
    setPackSize(String(known?.packSize ?? 1))
    setBreaks(known ? breaksText(known.priceBreaks) : '1 @ 0.00')
  }
  const submit = () => {
    setErrors({})
    if (!partId) {
      setErrors({ partId: 'Choose a part' })
      return
    }
    save.mutate(
      { supplierId: supplier.id, partId, input: { supplierSku, packSize: Number(packSize), priceBreaks: parseBreaks(breaks), preferred: true } },
      {
        onSuccess: () => toast.success(`Saved what ${supplier.name} sells of that part`),
        onError: (err) => {
          if (err instanceof ApiError) setErrors(err.body.fields ?? {})
          toast.error(errorText(err))
        },
      },
    )
  }
  const breakError = Object.entries(errors).find(([k]) => k.startsWith('priceBreaks'))?.[1]
  return (
    <div className="space-y-3 border-t border-stone-200 pt-3">
      <h3 className="font-bold">A part they sell</h3>
      <div className="grid gap-3 md:grid-cols-4">
        <Field label="Part" error={errors.partId}>
          <Select value={partId} onChange={(e) => pick(e.target.value)}>
            <option value="">Choose a part…</option>
            {(parts.data ?? []).map((p) => (
              <option key={p.id} value={p.id}>
                {p.sku} — {p.name}
              </option>
            ))}
          </Select>
        </Field>
        <Field label="Their SKU" error={errors.supplierSku}>
          <Input value={supplierSku} onChange={(e) => setSupplierSku(e.target.value)} />
        </Field>
        <Field label="Pack size" hint="Orders round up to whole packs" error={errors.packSize}>
          <Input inputMode="numeric" value={packSize} onChange={(e) => setPackSize(e.target.value)} />
        </Field>
        <Field label="Price breaks" hint="From quantity @ unit price ($), e.g. 1 @ 10.00; 10 @ 9.00" error={breakError}>
          <Input value={breaks} onChange={(e) => setBreaks(e.target.value)} />
        </Field>
      </div>
      <Button variant="secondary" disabled={save.isPending} onClick={submit}>
        Save the part for {supplier.name}
      </Button>
      <p className="text-sm text-stone-600">Saving makes {supplier.name} the part's supplier: drafts from shortages for it go to them.</p>
    </div>
  )
}
