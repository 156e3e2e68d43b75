import { z } from 'zod'
import { WorkOrderStatusSchema } from './orders'

const uuid = z.string().uuid()

/** What every worklist row says about urgency: rush, the promise and whether it is late, and since when it waits. */
const Urgency = {
  rush: z.boolean(),
  promisedShipDate: z.string().nullable(),
  late: z.boolean(),
  /** Since when it has waited for this bench (ISO time). */
  waitingSince: z.string(),
}

/** A unit ready for the build bench: cut (its bin filled), being built, or back in rework. */
export const BuildWorklistItemSchema = z.object({
  workOrderId: uuid,
  serial: z.string(),
  status: WorkOrderStatusSchema,
  kitSku: z.string(),
  kitName: z.string(),
  revisionCode: z.string(),
  binCode: z.string().nullable(),
  orderId: uuid,
  orderNumber: z.string(),
  ...Urgency,
})
/** A unit ready for the build bench. */
export type BuildWorklistItem = z.infer<typeof BuildWorklistItemSchema>

/** An order with units ready for the pack bench (built and leak-tested), not on hold. */
export const PackWorklistItemSchema = z.object({
  orderId: uuid,
  orderNumber: z.string(),
  customerName: z.string(),
  shipCountry: z.string(),
  /** Units built and waiting to be packed, with their bins; scan or pick to open the order. */
  ready: z.array(z.object({ serial: z.string(), binCode: z.string().nullable() })),
  /** Units of the order still to ship, ready or not. */
  unitsToShip: z.number().int(),
  ...Urgency,
})
/** An order with units ready for the pack bench. */
export type PackWorklistItem = z.infer<typeof PackWorklistItemSchema>

/** A published cut run for the cut bench, with its most urgent order. */
export const CutWorklistItemSchema = z.object({
  runId: uuid,
  number: z.string(),
  cutsDone: z.number().int(),
  cutsTotal: z.number().int(),
  workOrderCount: z.number().int(),
  /** Rush units in the run. */
  rushUnits: z.number().int(),
  ...Urgency,
})
/** A published cut run for the cut bench. */
export type CutWorklistItem = z.infer<typeof CutWorklistItemSchema>
