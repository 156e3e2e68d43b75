import { zodResolver } from '@hookform/resolvers/zod'
import { Controller, useForm } from 'react-hook-form'
import { toast } from 'sonner'
import { NewOrderSchema, type NewOrder, type NewOrderDraft, type OrderDetail } from '@kitwright/shared/orders'
import { Button } from '../../../components/ui/button'
import { Field, Input } from '../../../components/ui/field'
import { applyServerErrors } from '../../../lib/form-errors'
import { useCreateOrder } from '../api/order-queries'
import { EMPTY_LINE, OrderLinesEditor } from './order-lines-editor'

/** An ISO moment as the text of a datetime-local box (the browser's local time). */
function toLocalInput(iso: string): string {
  const d = new Date(iso)
  if (Number.isNaN(d.getTime())) return ''
  const local = new Date(d.getTime() - d.getTimezoneOffset() * 60_000)
  return local.toISOString().slice(0, 16)
}

function emptyOrder(): NewOrderDraft {
  return {
    number: '',
    customer: { name: '', email: '', phone: '' },
    shipTo: { name: '', line1: '', line2: '', city: '', region: '', postalCode: '', country: 'US' },
    placedAt: new Date().toISOString(),
    promisedShipDate: undefined,
    note: '',
    lines: [EMPTY_LINE],
  }
}

const legend = 'text-xl font-bold'

/** The phone order form: customer, ship-to, lines; checked by the same schema as the API. */
export function OrderForm({ onCreated }: { onCreated: (order: OrderDetail) => void }) {
  const create = useCreateOrder()
  const form = useForm<NewOrderDraft, unknown, NewOrder>({ resolver: zodResolver(NewOrderSchema), defaultValues: emptyOrder() })
  const { errors } = form.formState
  const { register } = form

  const submit = (input: NewOrder) =>
    create.mutate(input, {
      onSuccess: (order) => {
        toast.success(`Order ${order.number} saved`)
        onCreated(order)
      },
      onError: (err) => applyServerErrors(err, form.setError),
    })

  return (
    <form onSubmit={form.handleSubmit(submit)} noValidate aria-label="Phone order" className="space-y-6 rounded-lg border border-stone-300 bg-white p-4">
      <fieldset className="grid gap-3 sm:grid-cols-3">
        <legend className={legend}>Order</legend>
        <Field label="Order number" hint="As told to the customer, e.g. P-0302" error={errors.number?.message}>
          <Input aria-invalid={!!errors.number} {...register('number')} />
        </Field>
        <Field label="Placed" error={errors.placedAt?.message}>
          <Controller
            control={form.control}
            name="placedAt"
            render={({ field }) => (
              <Input
                type="datetime-local"
                aria-invalid={!!errors.placedAt}
                value={toLocalInput(field.value)}
                onBlur={field.onBlur}
                onChange={(e) => field.onChange(e.target.value ? new Date(e.target.value).toISOString() : '')}
              />
            )}
          />
        </Field>
        <Field label="Promised ship date (optional)" error={errors.promisedShipDate?.message}>
          <Input type="date" aria-invalid={!!errors.promisedShipDate} {...register('promisedShipDate', { setValueAs: (v: string) => v || undefined })} />
        </Field>
      </fieldset>
      <fieldset className="grid gap-3 sm:grid-cols-3">
        <legend className={legend}>Customer</legend>
        <Field label="Name" error={errors.customer?.name?.message}>
          <Input autoComplete="off" aria-invalid={!!errors.customer?.name} {...register('customer.name')} />
        </Field>
        <Field label="E-mail" error={errors.customer?.email?.message}>
          <Input type="email" autoComplete="off" aria-invalid={!!errors.customer?.email} {...register('customer.email')} />
        </Field>
        <Field label="Phone (optional)" error={errors.customer?.phone?.message}>
          <Input type="tel" autoComplete="off" {...register('customer.phone')} />
        </Field>
      </fieldset>
      <fieldset className="grid gap-3 sm:grid-cols-3">
        <legend className={legend}>Ship to</legend>
        <Field label="Name on the parcel" error={errors.shipTo?.name?.message}>
          <Input aria-invalid={!!errors.shipTo?.name} {...register('shipTo.name')} />
        </Field>
        <Field label="Street address" error={errors.shipTo?.line1?.message}>
          <Input aria-invalid={!!errors.shipTo?.line1} {...register('shipTo.line1')} />
        </Field>
        <Field label="Address line 2 (optional)" error={errors.shipTo?.line2?.message}>
          <Input {...register('shipTo.line2')} />
        </Field>
        <Field label="City" error={errors.shipTo?.city?.message}>
          <Input aria-invalid={!!errors.shipTo?.city} {...register('shipTo.city')} />
        </Field>
        <Field label="State / region (optional)" error={errors.shipTo?.region?.message}>
          <Input {...register('shipTo.region')} />
        </Field>
        <Field label="Postal code" error={errors.shipTo?.postalCode?.message}>
          <Input aria-invalid={!!errors.shipTo?.postalCode} {...register('shipTo.postalCode')} />
        </Field>
        <Field label="Country" hint="Two letters: US, CA, GB…" error={errors.shipTo?.country?.message}>
          <Input maxLength={2} className="uppercase" aria-invalid={!!errors.shipTo?.country} {...register('shipTo.country')} />
        </Field>
      </fieldset>
      <OrderLinesEditor control={form.control} register={register} errors={errors} />
      <Field label="Note (optional)" error={errors.note?.message}>
        <Input {...register('note')} />
      </Field>
      <Button type="submit" disabled={create.isPending}>
        Save order
      </Button>
    </form>
  )
}
