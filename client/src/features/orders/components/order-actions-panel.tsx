import { zodResolver } from '@hookform/resolvers/zod'
import { useState } from 'react'
import { useForm } from 'react-hook-form'
import { toast } from 'sonner'
import { CancelOrderSchema, HoldOrderSchema, ORDER_PRIORITY_LABELS, OrderPrioritySchema, type CancelOrder, type HoldOrder, type OrderDetail } from '@kitwright/shared/orders'
import { ORDER_PRIORITIES } from '@kitwright/shared/orders-status'
import { Button } from '../../../components/ui/button'
import { Field, Input, Select } from '../../../components/ui/field'
import { ApiError } from '../../../lib/api-client'
import { applyServerErrors } from '../../../lib/form-errors'
import { useCancelOrder, useHoldOrder, useLiftOrderHold, useUpdateOrderPlan } from '../api/use-order-actions'
import { formatDateTime } from './format'

function failed(err: unknown) {
  toast.error(err instanceof ApiError ? err.message : 'Could not reach Kitwright; check the connection and try again', { duration: 10_000 })
}

function PrioritySelect({ order }: { order: OrderDetail }) {
  const update = useUpdateOrderPlan(order.id)
  return (
    <Field label="Priority">
      <Select
        value={order.priority}
        disabled={update.isPending}
        className="w-36"
        onChange={(e) =>
          update.mutate(
            { priority: OrderPrioritySchema.parse(e.target.value) },
            { onSuccess: (o) => toast.success(`Order ${o.number} is ${ORDER_PRIORITY_LABELS[o.priority].toLowerCase()} priority`), onError: failed },
          )
        }
      >
        {ORDER_PRIORITIES.map((p) => (
          <option key={p} value={p}>
            {ORDER_PRIORITY_LABELS[p]}
          </option>
        ))}
      </Select>
    </Field>
  )
}

function HoldBanner({ order }: { order: OrderDetail }) {
  const lift = useLiftOrderHold(order.id)
  return (
    <div role="status" aria-label="On hold" className="flex flex-wrap items-center gap-3 rounded-lg border-2 border-orange-500 bg-orange-50 p-4">
      <p className="mr-auto">
        <span className="font-bold">On hold: {order.holdReason}</span>
        <span className="block text-sm text-stone-700">
          {order.heldByName ? `By ${order.heldByName}` : 'Held'}
          {order.heldAt ? `, ${formatDateTime(order.heldAt)}` : ''}. It is not released or shipped until it is taken off hold.
        </span>
      </p>
      <Button variant="secondary" disabled={lift.isPending} onClick={() => lift.mutate(undefined, { onSuccess: (o) => toast.success(`Order ${o.number} is off hold`), onError: failed })}>
        Take off hold
      </Button>
    </div>
  )
}

function HoldForm({ order, onDone }: { order: OrderDetail; onDone: () => void }) {
  const hold = useHoldOrder(order.id)
  const form = useForm<HoldOrder>({ resolver: zodResolver(HoldOrderSchema), defaultValues: { reason: '' } })
  const submit = form.handleSubmit((values) =>
    hold.mutate(values.reason, {
      onSuccess: (o) => {
        toast.success(`Order ${o.number} is on hold`)
        onDone()
      },
      onError: (err) => applyServerErrors(err, form.setError),
    }),
  )
  return (
    <form onSubmit={submit} aria-label="Put on hold" className="flex flex-wrap items-end gap-3">
      <div className="min-w-64 flex-1">
        <Field label="Reason to hold" error={form.formState.errors.reason?.message}>
          <Input {...form.register('reason')} placeholder="e.g. address to confirm with the customer" aria-invalid={!!form.formState.errors.reason} autoFocus />
        </Field>
      </div>
      <Button type="submit" disabled={hold.isPending}>
        Put on hold
      </Button>
      <Button variant="ghost" onClick={onDone}>
        Never mind
      </Button>
    </form>
  )
}

function CancelForm({ order, onDone }: { order: OrderDetail; onDone: () => void }) {
  const cancel = useCancelOrder(order.id)
  const form = useForm<CancelOrder>({ resolver: zodResolver(CancelOrderSchema), defaultValues: { reason: '' } })
  const units = order.workOrders.filter((w) => w.status !== 'shipped' && w.status !== 'cancelled').length
  const submit = form.handleSubmit((values) =>
    cancel.mutate(values.reason, {
      onSuccess: (o) => {
        toast.success(`Order ${o.number} is cancelled`)
        onDone()
      },
      onError: (err) => applyServerErrors(err, form.setError),
    }),
  )
  return (
    <form onSubmit={submit} aria-label="Cancel the order" className="space-y-3 rounded-md border border-red-300 bg-white p-3">
      <p className="text-stone-800">
        {units > 0
          ? `Its ${units} unshipped work order${units === 1 ? '' : 's'} will be cancelled: reserved stock goes back, bins are freed and pieces already cut go to the offcut rack.`
          : 'It has no work orders yet; nothing is reserved.'}{' '}
        This cannot be undone.
      </p>
      <div className="flex flex-wrap items-end gap-3">
        <div className="min-w-64 flex-1">
          <Field label="Reason to cancel" error={form.formState.errors.reason?.message}>
            <Input {...form.register('reason')} placeholder="e.g. the customer changed their mind" aria-invalid={!!form.formState.errors.reason} autoFocus />
          </Field>
        </div>
        <Button type="submit" variant="danger" disabled={cancel.isPending}>
          Cancel this order
        </Button>
        <Button variant="ghost" onClick={onDone}>
          Keep the order
        </Button>
      </div>
    </form>
  )
}

/**
 * What a planner decides about an order that is still to ship: its priority, a hold with its
 * reason, or cancelling it.
 */
export function OrderActionsPanel({ order }: { order: OrderDetail }) {
  const [open, setOpen] = useState<'hold' | 'cancel' | null>(null)
  if (order.status === 'cancelled' || order.status === 'shipped') return null
  return (
    <div className="space-y-3">
      {order.onHold && <HoldBanner order={order} />}
      <div className="flex flex-wrap items-end gap-3">
        <PrioritySelect order={order} />
        {!order.onHold && open !== 'hold' && (
          <Button variant="secondary" onClick={() => setOpen('hold')}>
            Put on hold…
          </Button>
        )}
        {open !== 'cancel' && (
          <Button variant="secondary" onClick={() => setOpen('cancel')}>
            Cancel order…
          </Button>
        )}
      </div>
      {open === 'hold' && !order.onHold && <HoldForm order={order} onDone={() => setOpen(null)} />}
      {open === 'cancel' && <CancelForm order={order} onDone={() => setOpen(null)} />}
    </div>
  )
}
