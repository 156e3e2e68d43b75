import { queryOptions, useMutation, useQueryClient } from '@tanstack/react-query'
import { z } from 'zod'
import { PackViewSchema, QuoteSchema, ShipResultSchema, type BuyLabel, type PackItem, type PackView, type QuoteRequest } from '@kitwright/shared/pack'
import { CustomsSummarySchema } from '@kitwright/shared/customs'
import { apiFetch } from '../../../lib/api-client'
import { cancelWaiting, submitBenchAction, type BenchActionSpec } from '../../../lib/offline/bench-queue'
import { waitingDirection } from './pack-waiting'

export const packKeys = {
  all: ['pack-bench'] as const,
  order: (orderId: string) => [...packKeys.all, 'order', orderId] as const,
  customs: (shipmentId: string, status: string) => [...packKeys.all, 'customs', shipmentId, status] as const,
}

/** Whether the shipment needs a customs declaration, and its form per parcel once the label is bought. */
export function customsSummaryOptions(shipmentId: string, status: string) {
  return queryOptions({
    queryKey: packKeys.customs(shipmentId, status),
    queryFn: ({ signal }) => apiFetch(`/shipments/${shipmentId}/customs`, CustomsSummarySchema, { signal }),
  })
}

/** The pack view of one order; refreshed now and then, as a planner may approve a partial shipment meanwhile. */
export function packOrderOptions(orderId: string) {
  return queryOptions({
    queryKey: packKeys.order(orderId),
    queryFn: ({ signal }) => apiFetch(`/pack/orders/${orderId}`, PackViewSchema, { signal }),
    refetchInterval: 20_000,
  })
}

/** Every bench action answers with the whole view: show it at once. */
function useViewAction<V>(request: (v: V) => Promise<PackView>) {
  const qc = useQueryClient()
  return useMutation({
    mutationFn: request,
    onSuccess: (view: PackView) => qc.setQueryData(packKeys.order(view.order.id), view),
  })
}

/** A scan with no order open: the order the bin or serial belongs to. */
export const useLookup = () => useViewAction((code: string) => apiFetch(`/pack/lookup?code=${encodeURIComponent(code)}`, PackViewSchema))
/**
 * A pack bench action through the tablet's queue (lib/offline/): kept first, sent in order, waiting
 * while the network is down (the banner counts it, the packing list marks it: `overlayWaiting` in
 * pack-waiting.ts); the view is refreshed once it went through.
 */
function useQueuedViewAction<V>(spec: (v: V) => BenchActionSpec & { path: string }, takeBack?: (v: V) => Promise<boolean>) {
  const qc = useQueryClient()
  return useMutation({
    mutationFn: async (v: V) => {
      if (takeBack && (await takeBack(v))) return null
      const outcome = await submitBenchAction(spec(v), PackViewSchema)
      return outcome.sent ? outcome.data : null
    },
    onSuccess: (view: PackView | null) => {
      if (!view) return
      qc.setQueryData(packKeys.order(view.order.id), view)
      // Read once more through the service worker, so the copy it keeps for a reload with no network has this action too.
      void qc.invalidateQueries({ queryKey: packKeys.order(view.order.id) })
    },
  })
}

export const useScanItem = () =>
  useQueuedViewAction((v: { orderId: string; code: string }) => ({
    bench: 'pack',
    kind: 'pack.scan',
    label: `Scan ${v.code} into the box`,
    path: `/pack/orders/${v.orderId}/scan`,
    body: { code: v.code },
    target: { orderId: v.orderId },
  }))
/** Takes back the latest action on this item still waiting on the tablet that goes the given way; true when one was dropped. */
const takeBack = (orderId: string, item: PackItem, put: 'in' | 'out') => cancelWaiting((a) => a.target.orderId === orderId && waitingDirection(item, a) === put)

/** Ticks a bag or pack into the box; an undo of it still waiting on the tablet is simply taken back. */
export const useTickItem = () =>
  useQueuedViewAction(
    (v: { orderId: string; item: PackItem }) => ({
      bench: 'pack',
      kind: 'pack.tick',
      label: `Tick ${v.item.key} as in the box`,
      path: `/pack/orders/${v.orderId}/tick`,
      body: { itemKey: v.item.key },
      target: { orderId: v.orderId },
    }),
    (v) => takeBack(v.orderId, v.item, 'out'),
  )
/** Takes an item out of the box; a scan or tick of it still waiting on the tablet is simply taken back. */
export const useUndoItem = () =>
  useQueuedViewAction(
    (v: { orderId: string; item: PackItem }) => ({
      bench: 'pack',
      kind: 'pack.undo',
      label: `Take ${v.item.key} out of the box`,
      path: `/pack/orders/${v.orderId}/undo`,
      body: { itemKey: v.item.key },
      target: { orderId: v.orderId },
    }),
    (v) => takeBack(v.orderId, v.item, 'in'),
  )
export const useApprovePartial = () =>
  useViewAction((v: { orderId: string; note: string }) =>
    apiFetch(`/pack/orders/${v.orderId}/approve-partial`, PackViewSchema, { method: 'POST', body: { note: v.note } }),
  )
/** Buying spends money: it is kept with its id before it is sent, and offline it waits with its badge (the server's idempotency keeps it to one label). */
export const useBuyLabel = () =>
  useQueuedViewAction((v: BuyLabel & { orderId: string }) => ({
    bench: 'pack',
    kind: 'pack.label',
    label: `Buy the shipping label (${v.service})`,
    path: `/pack/orders/${v.orderId}/label`,
    body: { service: v.service, parcels: v.parcels },
    target: { orderId: v.orderId },
    needsServer: true,
  }))

/** Voids the shipment's label with why; the carrier is asked to refund it. */
export const useVoidLabel = () =>
  useViewAction((v: { shipmentId: string; reason: string }) =>
    apiFetch(`/shipments/${v.shipmentId}/void-label`, PackViewSchema, { method: 'POST', body: { reason: v.reason } }),
  )

export function useQuote() {
  return useMutation({
    mutationFn: (v: QuoteRequest & { orderId: string }) =>
      apiFetch(`/pack/orders/${v.orderId}/quote`, z.array(QuoteSchema), { method: 'POST', body: { parcels: v.parcels } }),
  })
}

export function useShip() {
  const qc = useQueryClient()
  return useMutation({
    mutationFn: (orderId: string) => apiFetch(`/pack/orders/${orderId}/ship`, ShipResultSchema, { method: 'POST', body: {} }),
    onSuccess: (result) => qc.invalidateQueries({ queryKey: packKeys.order(result.view.order.id) }),
  })
}

export const packingSlipHref = (shipmentId: string, paper: 'letter' | 'a4') => `/api/shipments/${shipmentId}/packing-slip.pdf?paper=${paper}`
export const shippingLabelHref = (shipmentId: string) => `/api/shipments/${shipmentId}/label.pdf`
export const customsDeclarationHref = (shipmentId: string) => `/api/shipments/${shipmentId}/customs-declaration.pdf`
