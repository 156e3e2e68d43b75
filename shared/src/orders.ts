import { z } from 'zod'
import { PostalAddressSchema } from './address'
import { EmailSchema } from './auth'
import { countryCodeSchema } from './customs'
import { MeasurementFlagSchema } from './measurement-flags'
import { ORDER_STAGES } from './order-stage'
import { ORDER_PRIORITIES, ORDER_SOURCES, ORDER_STATUSES, PAYMENT_STATUSES, WORK_ORDER_STATUSES } from './orders-status'
import { PageNumberSchema, PageOf, PageSizeSchema, SortDirSchema } from './pagination'

const uuid = z.string().uuid('Not a valid id')

/** Where an order is. */
export const OrderStatusSchema = z.enum(ORDER_STATUSES)
/** Where an order is. */
export type OrderStatus = z.infer<typeof OrderStatusSchema>
/** The payment state the store reports. */
export const PaymentStatusSchema = z.enum(PAYMENT_STATUSES)
/** The payment state the store reports. */
export type PaymentStatus = z.infer<typeof PaymentStatusSchema>
/** Where an order came from. */
export const OrderSourceSchema = z.enum(ORDER_SOURCES)
/** Where an order came from. */
export type OrderSource = z.infer<typeof OrderSourceSchema>
/** Where one unit (work order) is. */
export const WorkOrderStatusSchema = z.enum(WORK_ORDER_STATUSES)
/** Where one unit (work order) is. */
export type WorkOrderStatus = z.infer<typeof WorkOrderStatusSchema>

/** How urgent an order is. */
export const OrderPrioritySchema = z.enum(ORDER_PRIORITIES, { error: `Use one of ${ORDER_PRIORITIES.join(', ')}` })
/** How urgent an order is. */
export type OrderPriority = z.infer<typeof OrderPrioritySchema>
/** What each priority is called on screen. */
export const ORDER_PRIORITY_LABELS: Record<OrderPriority, string> = { normal: 'Normal', rush: 'Rush' }
/** Where an order is in its life (see `order-stage.ts`). */
export const OrderStageSchema = z.enum(ORDER_STAGES, { error: `Use one of ${ORDER_STAGES.join(', ')}` })

/**
 * Kinds of timeline event Kitwright writes on an order. The column is free text so a new kind needs
 * no migration; these are the ones the screens know by name.
 */
export const ORDER_EVENT_KINDS = [
  'received',
  'duplicate_ignored',
  'unmapped_line',
  'payment',
  'address_changed',
  'released',
  'shortage',
  'cancelled',
  'held',
  'hold_lifted',
  'priority',
  'promised_date',
  'mail_queued',
  'mail_sent',
  'note',
  'recall',
] as const
/** A kind of timeline event (known kinds in {@link ORDER_EVENT_KINDS}; others may appear). */
export type OrderEventKind = (typeof ORDER_EVENT_KINDS)[number]

const requiredText = (what: string, max: number) =>
  z
    .string({ error: `Enter the ${what}` })
    .trim()
    .min(1, `Enter the ${what}`)
    .max(max, `Use at most ${max} characters`)
const optionalText = (max: number) =>
  z
    .string()
    .trim()
    .max(max, `Use at most ${max} characters`)
    .nullish()
    .transform((v) => (v ? v : undefined))

/** An order number as the store (or the phone desk) writes it: letters, digits, `-`, `_`, `.`, `#`, `/`. */
export const OrderNumberSchema = requiredText('order number', 40).regex(/^[A-Za-z0-9#._/-]+$/, 'Use letters, digits and - _ . # / only (no spaces)')

/**
 * ISO 3166-1 alpha-2 country code, e.g. US, CA, GB; lower case is accepted and upper-cased. Only
 * officially assigned codes pass (the list of i18n-iso-countries): `ZZ` is refused.
 */
export const CountryCodeSchema = countryCodeSchema('the country it ships to')

/** A calendar date, `YYYY-MM-DD`. */
export const IsoDateSchema = z.iso.date('Use a date as YYYY-MM-DD')

/** The customer on an order. */
export const CustomerSchema = z.object({
  name: requiredText('customer name', 120),
  email: EmailSchema,
  phone: optionalText(40),
})
/** The customer on an order. */
export type Customer = z.infer<typeof CustomerSchema>

/** Where an order ships to. */
export const ShipToSchema = z.object({
  name: requiredText('name to ship to', 120),
  line1: requiredText('street address', 200),
  line2: optionalText(200),
  city: requiredText('city', 100),
  region: optionalText(100),
  postalCode: requiredText('postal code', 20),
  country: CountryCodeSchema,
})
/** Where an order ships to. */
export type ShipTo = z.infer<typeof ShipToSchema>

/**
 * One line of a new order: a kit by its SKU, or the store's product id (mapped to a kit through the
 * kit's store product id). A line that maps to no kit is kept and flagged for the planner.
 */
export const NewOrderLineSchema = z
  .object({
    kitSku: optionalText(40),
    storeProductId: optionalText(80),
    /** What the store calls the product; shown when the line maps to no kit. */
    description: optionalText(200),
    quantity: z.number({ error: 'Enter a quantity' }).int('Use a whole number').min(1, 'At least 1').max(500, 'At most 500 per line'),
    unitPriceCents: z.number({ error: 'Enter a price' }).int('Whole cents').min(0, 'Cannot be negative').max(10_000_000, 'At most 100 000.00'),
  })
  .refine((l) => l.kitSku !== undefined || l.storeProductId !== undefined, { message: 'Choose a kit (its SKU) or give the store product id', path: ['kitSku'] })
/** One line of a new order. */
export type NewOrderLine = z.infer<typeof NewOrderLineSchema>

/**
 * A new order, from the store, a CSV file or the phone. Money in cents, `placedAt` an ISO date-time
 * with its offset, `promisedShipDate` a calendar date. Orders are idempotent by `number`.
 */
export const NewOrderSchema = z.object({
  number: OrderNumberSchema,
  customer: CustomerSchema,
  shipTo: ShipToSchema,
  placedAt: z.iso.datetime({ offset: true, error: 'Use a date and time such as 2026-03-01T14:30:00Z' }),
  promisedShipDate: IsoDateSchema.nullish().transform((v) => v ?? undefined),
  note: optionalText(1000),
  /** The store's word on payment; phone and CSV orders may leave it out (pending). */
  paymentStatus: PaymentStatusSchema.optional(),
  currency: z
    .string()
    .trim()
    .toUpperCase()
    .regex(/^[A-Z]{3}$/, 'Use a three-letter currency code such as USD')
    .default('USD'),
  lines: z.array(NewOrderLineSchema).min(1, 'Add at least one line').max(100, 'At most 100 lines'),
})
/** A new order (parsed). */
export type NewOrder = z.infer<typeof NewOrderSchema>
/** A new order as typed into the form, before parsing. */
export type NewOrderDraft = z.input<typeof NewOrderSchema>

/** An order as a row of the orders list. */
export const OrderSchema = z.object({
  id: uuid,
  number: z.string(),
  source: OrderSourceSchema,
  status: OrderStatusSchema,
  paymentStatus: PaymentStatusSchema,
  customerName: z.string(),
  customerEmail: z.string(),
  shipCity: z.string(),
  shipCountry: z.string(),
  placedAt: z.string(),
  promisedShipDate: z.string().nullable(),
  totalCents: z.number().int(),
  currency: z.string(),
  /** Units ordered over all lines. */
  units: z.number().int(),
  /** The lines in short, e.g. `2 × MW-TOTE-12, 1 × MW-SPARE-CUP12`. */
  summary: z.string(),
  /** Lines whose store product maps to no kit: the planner must map them before release. */
  unmappedLines: z.number().int(),
  workOrderCount: z.number().int(),
  /** Past its promised ship date and not shipped or cancelled. */
  late: z.boolean(),
  /** Where the order is in its life, read from its status, its hold and its work orders. */
  stage: OrderStageSchema,
  priority: OrderPrioritySchema,
  onHold: z.boolean(),
  /** Why a planner put it on hold; null when not on hold. */
  holdReason: z.string().nullable(),
})
/** An order as a row of the orders list. */
export type Order = z.infer<typeof OrderSchema>

/** One page of orders. */
export const OrdersPageSchema = PageOf(OrderSchema)
/** One page of orders. */
export type OrdersPage = z.infer<typeof OrdersPageSchema>

/** One line of an order as the detail shows it. */
export const OrderLineSchema = z.object({
  id: uuid,
  lineNo: z.number().int(),
  sku: z.string(),
  description: z.string(),
  storeProductId: z.string().nullable(),
  quantity: z.number().int(),
  unitPriceCents: z.number().int(),
  kit: z.object({ id: uuid, sku: z.string(), name: z.string() }).nullable(),
})
/** One line of an order. */
export type OrderLine = z.infer<typeof OrderLineSchema>

/** One event on an order's timeline, with who did it (null: the store or the system). */
export const OrderEventSchema = z.object({
  id: uuid,
  kind: z.string(),
  message: z.string(),
  data: z.unknown().nullable(),
  actorName: z.string().nullable(),
  createdAt: z.string(),
})
/** One event on an order's timeline. */
export type OrderEvent = z.infer<typeof OrderEventSchema>

/** A work order as an order's detail lists it. */
export const OrderWorkOrderSchema = z.object({
  id: uuid,
  serial: z.string(),
  status: WorkOrderStatusSchema,
  orderLineId: uuid,
  kitSku: z.string(),
  revisionCode: z.string(),
  dueDate: z.string().nullable(),
  createdAt: z.string(),
})
/** A work order as an order's detail lists it. */
export type OrderWorkOrder = z.infer<typeof OrderWorkOrderSchema>

/** An order with everything about it: lines with kits, customer, ship-to, timeline, work orders. */
export const OrderDetailSchema = OrderSchema.extend({
  customer: z.object({ name: z.string(), email: z.string(), phone: z.string().nullable() }),
  shipTo: PostalAddressSchema,
  note: z.string().nullable(),
  releasedAt: z.string().nullable(),
  shippedAt: z.string().nullable(),
  cancelledAt: z.string().nullable(),
  heldAt: z.string().nullable(),
  heldByName: z.string().nullable(),
  lines: z.array(OrderLineSchema),
  /** Oldest first. */
  events: z.array(OrderEventSchema),
  workOrders: z.array(OrderWorkOrderSchema),
  /** Out-of-limits measurements recorded at the build bench on its units, newest first; undone ones (reworked) included. */
  measurementFlags: z.array(MeasurementFlagSchema).default([]),
})
/** An order with everything about it. */
export type OrderDetail = z.infer<typeof OrderDetailSchema>

/** Columns the orders list sorts by. */
export const ORDER_SORT_FIELDS = ['number', 'placedAt', 'promisedShipDate', 'customer', 'status', 'total', 'priority'] as const
/** A column the orders list sorts by. */
export type OrderSortField = (typeof ORDER_SORT_FIELDS)[number]

/**
 * The orders list query: page, sort (by priority: rush first, ascending), filters (status, stage,
 * priority, late only, placed-date range, kit) and a free-text
 * search over number, customer name and e-mail. The API parses it strictly (400 on bad values);
 * the client reads its URL with `querySearchWithDefaults`, so a bad link falls back to defaults.
 * `from` and `to` are calendar dates, both inclusive, in UTC.
 */
export const OrderListQuerySchema = z
  .object({
    page: PageNumberSchema,
    pageSize: PageSizeSchema,
    sort: z.enum(ORDER_SORT_FIELDS, { error: `Sort by one of ${ORDER_SORT_FIELDS.join(', ')}` }).default('placedAt'),
    dir: SortDirSchema.default('desc'),
    status: OrderStatusSchema.optional(),
    stage: OrderStageSchema.optional(),
    priority: OrderPrioritySchema.optional(),
    /** `true`: only orders past their promised ship date and still to ship. */
    late: z.enum(['true'], { error: 'Use late=true, or leave it out' }).optional(),
    from: IsoDateSchema.optional(),
    to: IsoDateSchema.optional(),
    kitId: uuid.optional(),
    q: z
      .string()
      .trim()
      .max(100, 'Search for at most 100 characters')
      .optional()
      .transform((v) => (v ? v : undefined)),
  })
  .strict()
/** The orders list query. */
export type OrderListQuery = z.infer<typeof OrderListQuerySchema>

const reasonText = (what: string) =>
  z
    .string({ error: `Say why the order is ${what}` })
    .trim()
    .min(3, `Say why the order is ${what} (at least 3 characters)`)
    .max(500, 'Use at most 500 characters')

/** A planner puts an order on hold, saying why; a held order is neither released nor shipped. */
export const HoldOrderSchema = z.object({ reason: reasonText('on hold') }).strict()
/** A planner puts an order on hold. */
export type HoldOrder = z.infer<typeof HoldOrderSchema>

/**
 * A planner cancels an order, saying why: its unshipped work orders are cancelled, their reserved
 * stock released, their bins freed and pieces already cut stocked as offcuts.
 */
export const CancelOrderSchema = z.object({ reason: reasonText('cancelled') }).strict()
/** A planner cancels an order. */
export type CancelOrder = z.infer<typeof CancelOrderSchema>

/** A planner changes an order's priority or its promised ship date (null clears the date). */
export const UpdateOrderPlanSchema = z
  .object({
    priority: OrderPrioritySchema.optional(),
    promisedShipDate: IsoDateSchema.nullable().optional(),
  })
  .strict()
  .refine((v) => v.priority !== undefined || v.promisedShipDate !== undefined, { message: 'Give a priority or a promised ship date to change' })
/** A planner changes an order's priority or promised ship date. */
export type UpdateOrderPlan = z.infer<typeof UpdateOrderPlanSchema>
