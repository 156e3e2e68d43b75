import { z } from 'zod'
import { WORK_ORDER_STATUSES } from './orders-status'

const uuid = z.string().uuid('Not a valid id')

/**
 * An out-of-limits measurement recorded at the build bench (with the reason given): on the home
 * page while it stands on a unit not yet shipped, on the order page for every unit of the order.
 * Its own module so that both the build and the order contracts can carry it.
 */
export const MeasurementFlagSchema = z.object({
  tickId: uuid,
  workOrderId: uuid,
  serial: z.string(),
  workOrderStatus: z.enum(WORK_ORDER_STATUSES),
  orderId: uuid,
  orderNumber: z.string(),
  kitSku: z.string(),
  revisionCode: z.string(),
  stepPosition: z.number().int(),
  stepText: z.string(),
  measurement: z.number(),
  unit: z.string().nullable(),
  min: z.number().nullable(),
  max: z.number().nullable(),
  reason: z.string().nullable(),
  /** The revision sends such a unit to rework. */
  rework: z.boolean(),
  by: z.string(),
  at: z.string(),
  /**
   * When the step was undone to measure again (the rework done, or the value withdrawn), and by whom;
   * null while the value stands. The home page lists standing ones only.
   */
  undoneAt: z.string().nullable().default(null),
  undoneBy: z.string().nullable().default(null),
})
/** An out-of-limits measurement recorded at the build bench. */
export type MeasurementFlag = z.infer<typeof MeasurementFlagSchema>
