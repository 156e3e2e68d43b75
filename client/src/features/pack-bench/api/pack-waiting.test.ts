import { describe, expect, it } from 'vitest'
import type { PackItem, PackView } from '@kitwright/shared/pack'
import type { QueuedAction } from '../../../lib/offline/action-store'
import { overlayWaiting, waitingDirection } from './pack-waiting'

const ORDER = '7d1c0a52-3f7e-4c1b-9a55-0e2f6b1d8c41'
const OTHER_ORDER = '1b9e4d20-8c3a-4f6e-b2d7-5a0c9e8f7d13'
const WO = 'c3a8f1e2-6b4d-4e9a-8f01-2d7c5b9e3a60'
const SPARE_WO = 'e5b2d7c1-9a3f-4c8e-a6d2-7f1b0e4c9d35'
const PACKER = { id: '0f6a2c9e-4d1b-4a7f-9e3c-8b5d2a1f6c07', name: 'Rowan Ellery' }

function item(over: Partial<PackItem> & Pick<PackItem, 'key' | 'kind' | 'serial'>): PackItem {
  return {
    workOrderId: WO,
    workOrderStatus: 'built',
    kit: { sku: 'MW-TOTE-6C', name: 'Compact grow tote' },
    revisionCode: 'A',
    description: 'Compact grow tote',
    binCode: null,
    problem: null,
    tickable: over.kind !== 'unit',
    check: null,
    ...over,
  }
}

const confirmed = { method: 'tick' as const, code: null, by: PACKER, at: '2026-12-04T09:00:00.000Z' }

function view(items: PackItem[], status: 'packing' | 'labelled' | null = 'packing'): PackView {
  return {
    order: {
      id: ORDER,
      number: 'MW-1042',
      status: 'released',
      customerName: 'Hollis Marchbank',
      shipTo: { name: 'Hollis Marchbank', line1: '9 Lanternwood Close', line2: null, city: 'Ashgrove', region: 'OR', postalCode: '97019', country: 'US' },
    },
    shipment:
      status === null
        ? null
        : {
            id: '5e7c1d3a-2b9f-4d6e-8a10-c4f2e9b7a583',
            status,
            carrier: null,
            service: null,
            trackingNumber: null,
            chargeCents: null,
            partialApproval: null,
            shippedAt: null,
            trackingStatus: null,
            trackingUpdatedAt: null,
            voidedLabels: [],
            canVoid: false,
          },
    items,
    shippingSerials: items.map((i) => i.serial),
    backOrderedSerials: [],
    alreadyShipped: [],
    shipped: [],
    blockers: [],
    canLabel: false,
    canShip: false,
    canFinishBuying: false,
    parcels: [],
    boxes: [],
  }
}

let seq = 0
function action(kind: string, body: unknown, over: Partial<QueuedAction> = {}): QueuedAction {
  seq += 1
  return {
    seq,
    id: `00000000-0000-4000-8000-${String(seq).padStart(12, '0')}`,
    userId: PACKER.id,
    bench: 'pack',
    kind,
    label: kind,
    path: `/pack/orders/${ORDER}/x`,
    body,
    takenAt: `2026-12-04T10:0${seq % 10}:00.000Z`,
    needsServer: false,
    target: { orderId: ORDER },
    state: 'waiting',
    ...over,
  }
}

const unit = item({ key: 'unit:U-1042', kind: 'unit', serial: 'U-1042', binCode: 'BIN-0007' })
const bag = item({ key: 'bag:U-1042:MW-BAG-6C', kind: 'bag', serial: 'U-1042', binCode: 'BIN-0007' })
const spare = item({ key: 'pack:U-1043', kind: 'pack', serial: 'U-1043', workOrderId: SPARE_WO })

describe('which packing list item a queued pack bench action is about', () => {
  it('a scan names a unit by its bin or serial as the server reads it (trimmed, any case), never its bag', () => {
    expect(waitingDirection(unit, action('pack.scan', { code: ' bin-0007 ' }))).toBe('in')
    expect(waitingDirection(unit, action('pack.scan', { code: 'U-1042' }))).toBe('in')
    expect(waitingDirection(bag, action('pack.scan', { code: 'BIN-0007' }))).toBeNull()
    expect(waitingDirection(spare, action('pack.scan', { code: 'u-1043' }))).toBe('in')
    expect(waitingDirection(unit, action('pack.scan', { code: 'BIN-0008' }))).toBeNull()
  })

  it('a tick puts its item in, an undo takes it out; a label or a body not of that shape names no item', () => {
    expect(waitingDirection(bag, action('pack.tick', { itemKey: bag.key }))).toBe('in')
    expect(waitingDirection(bag, action('pack.undo', { itemKey: bag.key }))).toBe('out')
    expect(waitingDirection(spare, action('pack.tick', { itemKey: bag.key }))).toBeNull()
    expect(waitingDirection(bag, action('pack.label', { itemKey: bag.key }))).toBeNull()
    expect(waitingDirection(bag, action('pack.tick', { key: bag.key }))).toBeNull()
  })
})

describe('the packing list with what waits on the tablet', () => {
  it('marks items scanned or ticked offline as in the box, waiting, with how and when', () => {
    const shown = overlayWaiting(view([unit, bag, spare]), [action('pack.scan', { code: 'bin-0007' }), action('pack.tick', { itemKey: bag.key })])
    const [u, b, s] = shown.items
    expect(u!.waiting).toEqual({ put: 'in', method: 'scan', code: 'BIN-0007', at: expect.any(String) })
    expect(b!.waiting).toMatchObject({ put: 'in', method: 'tick', code: null })
    expect(s!.waiting).toBeUndefined()
    // The server's word is kept as it was: the mark sits beside it.
    expect(u!.check).toBeNull()
  })

  it('marks an undo of a confirmed item as out of the box, waiting; an undo of an item not in the box is no news', () => {
    const shown = overlayWaiting(view([{ ...bag, check: confirmed }, spare]), [
      action('pack.undo', { itemKey: bag.key }),
      action('pack.undo', { itemKey: spare.key }),
    ])
    expect(shown.items[0]!.waiting).toMatchObject({ put: 'out', method: 'tick' })
    expect(shown.items[1]!.waiting).toBeUndefined()
  })

  it('lets the last action on an item decide, and shows it waiting while an earlier one the other way waits too', () => {
    const tickedThenUndone = overlayWaiting(view([bag]), [action('pack.tick', { itemKey: bag.key }), action('pack.undo', { itemKey: bag.key })])
    expect(tickedThenUndone.items[0]!.waiting?.put).toBe('out')
    // Confirmed on the server, taken out and put back on the tablet: in, but not sent yet.
    const backIn = overlayWaiting(view([{ ...bag, check: confirmed }]), [action('pack.undo', { itemKey: bag.key }), action('pack.tick', { itemKey: bag.key })])
    expect(backIn.items[0]!.waiting?.put).toBe('in')
  })

  it('shows as confirmed once the server’s answer has the item (the sent action lingers a few seconds)', () => {
    const answered = view([{ ...bag, check: confirmed }])
    expect(overlayWaiting(answered, [action('pack.tick', { itemKey: bag.key })])).toBe(answered)
  })

  it('leaves alone what is not this order’s, an item with a problem, and a shipment past packing', () => {
    const mixed = view([unit, bag])
    expect(overlayWaiting(mixed, [action('pack.tick', { itemKey: bag.key }, { target: { orderId: OTHER_ORDER } })])).toBe(mixed)
    const held = view([{ ...unit, problem: 'Unit U-1042 has not passed its leak test' }])
    expect(overlayWaiting(held, [action('pack.scan', { code: 'BIN-0007' })])).toBe(held)
    const labelled = view([bag], 'labelled')
    expect(overlayWaiting(labelled, [action('pack.tick', { itemKey: bag.key })])).toBe(labelled)
    const none = view([bag], null)
    expect(overlayWaiting(none, [action('pack.tick', { itemKey: bag.key })]).items[0]!.waiting?.put).toBe('in')
  })
})
