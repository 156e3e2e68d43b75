import { z } from 'zod'
import { CUT_RUN_STATUSES, CUT_STATUSES, CUT_STICK_STATUSES, PLAN_STATUSES } from './cut-runs-status'
import { LengthSchema } from './parts'

const uuid = z.string().uuid('Not a valid id')
const isoDate = z.string().regex(/^\d{4}-\d{2}-\d{2}$/, 'Use a date like 2027-03-31')

/** A cut run's status. */
export const CutRunStatusSchema = z.enum(CUT_RUN_STATUSES)
/** A cut run's status. */
export type CutRunStatus = z.infer<typeof CutRunStatusSchema>

/** Which released work orders a planner may put in a cut run: by due date, by kit, or all. */
export const CandidateQuerySchema = z.object({
  dueBy: isoDate.optional(),
  kitId: uuid.optional(),
})
/** Filter of the work orders waiting to be cut. */
export type CandidateQuery = z.infer<typeof CandidateQuerySchema>

/** A work order waiting to be cut, with how much pipe it needs. */
export const CandidateWorkOrderSchema = z.object({
  id: uuid,
  serial: z.string(),
  orderNumber: z.string(),
  kitId: uuid,
  kitSku: z.string(),
  kitName: z.string(),
  revisionCode: z.string(),
  dueDate: z.string().nullable(),
  pieceCount: z.number().int(),
  pieceLength: z.number().int(),
})
/** A work order waiting to be cut. */
export type CandidateWorkOrder = z.infer<typeof CandidateWorkOrderSchema>

/** One stick length of a pipe part on hand, as the ledger says, and how many are free to plan. */
export const StickStockSchema = z.object({ stickLength: z.number().int(), onHand: z.number().int(), available: z.number().int() })
/** An offcut in stock that a run may use. */
export const OffcutStockSchema = z.object({ id: uuid, code: z.string(), length: z.number().int() })
/** A pipe part with its sticks and offcuts in stock, for the cut run form. */
export const PipeStockSchema = z.object({
  partId: uuid,
  sku: z.string(),
  name: z.string(),
  sticks: z.array(StickStockSchema),
  offcuts: z.array(OffcutStockSchema),
})
/** A pipe part with its sticks and offcuts in stock. */
export type PipeStock = z.infer<typeof PipeStockSchema>

/** One stock length the planner lets the engine use, and at most how many sticks of it. */
export const PlanStockLineSchema = z
  .object({ partId: uuid, stickLength: LengthSchema, maxSticks: z.number().int().min(0, 'Cannot be negative').max(100_000) })
  .strict()

/** What the planner asks the engine for: work orders, stock, and the saw's settings (defaults from the shop). */
export const PlanCutRunSchema = z
  .object({
    workOrderIds: z.array(uuid).min(1, 'Choose at least one work order').max(500, 'At most 500 work orders in one run'),
    /** Stock lengths to use; omitted: every length available in the ledger. */
    stock: z.array(PlanStockLineSchema).max(100).optional(),
    /** Use offcuts in stock (first, when they do not raise the cost). */
    useOffcuts: z.boolean().default(true),
    kerf: z.number().int('Lengths are whole base units').min(0, 'Cannot be negative').optional(),
    endTrim: z.number().int('Lengths are whole base units').min(0, 'Cannot be negative').optional(),
    minOffcut: z.number().int('Lengths are whole base units').min(1, 'Must be longer than zero').optional(),
    /** How long the engine may plan; omitted: the shop's setting (2 s unless changed). */
    timeLimitSeconds: z.number().min(0.5, 'At least half a second').max(120, 'At most 120 seconds').optional(),
  })
  .strict()
/** What the planner asks the engine for. */
export type PlanCutRun = z.infer<typeof PlanCutRunSchema>

/** "Take longer": plan a draft run again, same work orders and saw settings, with more time. */
export const ReplanCutRunSchema = z
  .object({ timeLimitSeconds: z.number().min(0.5, 'At least half a second').max(120, 'At most 120 seconds').default(30) })
  .strict()
/** Planning a draft again with more time. */
export type ReplanCutRun = z.infer<typeof ReplanCutRunSchema>
/** What the planner asks the engine for, before defaults. */
export type PlanCutRunInput = z.input<typeof PlanCutRunSchema>

/** One cut as the pages show it. */
export const CutSchema = z.object({
  id: uuid,
  position: z.number().int(),
  offset: z.number().int(),
  length: z.number().int(),
  label: z.string(),
  workOrderId: uuid,
  serial: z.string(),
  cutPartId: uuid,
  status: z.enum(CUT_STATUSES),
  cutAt: z.string().nullable(),
  cutBy: z.string().nullable(),
})
/** One cut. */
export type Cut = z.infer<typeof CutSchema>

/** One stick of a run with its cuts, in saw order. */
export const CutStickSchema = z.object({
  id: uuid,
  position: z.number().int(),
  patternIndex: z.number().int(),
  partId: uuid,
  partSku: z.string(),
  source: z.enum(['stock', 'offcut']),
  stickLength: z.number().int().nullable(),
  sourceOffcutCode: z.string().nullable(),
  length: z.number().int(),
  trim: z.number().int(),
  status: z.enum(CUT_STICK_STATUSES),
  remnant: z.number().int(),
  remnantIsOffcut: z.boolean(),
  offcutId: uuid.nullable(),
  offcutCode: z.string().nullable(),
  damagedReason: z.string().nullable(),
  replanned: z.boolean(),
  cuts: z.array(CutSchema),
})
/** One stick of a run. */
export type CutStick = z.infer<typeof CutStickSchema>

/** A work order in a run: its pieces, how many are cut, and its bin. */
export const RunWorkOrderSchema = z.object({
  id: uuid,
  serial: z.string(),
  kitSku: z.string(),
  revisionCode: z.string(),
  status: z.string(),
  pieces: z.number().int(),
  cut: z.number().int(),
  bin: z.object({ id: uuid, code: z.string() }).nullable(),
})
/** A work order in a run. */
export type RunWorkOrder = z.infer<typeof RunWorkOrderSchema>

/** The plan's totals (summed over the pipe parts); lengths in base units. */
export const CutRunTotalsSchema = z.object({
  stockCost: z.number(),
  lowerBoundCost: z.number(),
  sticksUsed: z.number().int(),
  lowerBoundSticks: z.number().int(),
  offcutsUsed: z.number().int(),
  offcutsMade: z.number().int(),
  lengthUsed: z.number(),
  pieceLength: z.number(),
  kerfLoss: z.number(),
  trimLoss: z.number(),
  offcutLength: z.number(),
  scrapLength: z.number(),
  waste: z.number(),
  wastePercent: z.number(),
  /** (cost − lower bound) / cost: how far the plan may be from the best possible. */
  gap: z.number(),
})
/** The plan's totals. */
export type CutRunTotals = z.infer<typeof CutRunTotalsSchema>

/** A cut run in a list. */
export const CutRunSummarySchema = z.object({
  id: uuid,
  number: z.string(),
  status: CutRunStatusSchema,
  planStatus: z.enum(PLAN_STATUSES),
  workOrderCount: z.number().int(),
  sticksUsed: z.number().int(),
  cutsDone: z.number().int(),
  cutsTotal: z.number().int(),
  createdAt: z.string(),
  publishedAt: z.string().nullable(),
})
/** A cut run in a list. */
export type CutRunSummary = z.infer<typeof CutRunSummarySchema>

/** A cut run with its sticks, cuts, work orders and totals. */
export const CutRunDetailSchema = z.object({
  id: uuid,
  number: z.string(),
  status: CutRunStatusSchema,
  planStatus: z.enum(PLAN_STATUSES),
  kerf: z.number().int(),
  endTrim: z.number().int(),
  minOffcut: z.number().int(),
  solveMs: z.number().int(),
  /** Why the plan has no proof, when the LP solver could not be loaded: the greedy plan was kept. */
  solverNote: z.string().nullable(),
  totals: CutRunTotalsSchema,
  createdAt: z.string(),
  createdBy: z.string().nullable(),
  publishedAt: z.string().nullable(),
  publishedBy: z.string().nullable(),
  workOrders: z.array(RunWorkOrderSchema),
  sticks: z.array(CutStickSchema),
})
/** A cut run with everything about it. */
export type CutRunDetail = z.infer<typeof CutRunDetailSchema>

/** A stick is damaged or miscut: why, and which pieces already ticked were spoiled with it. */
export const DamageStickSchema = z
  .object({
    reason: z.string().trim().min(1, 'Say what happened to the stick').max(200, 'Use at most 200 characters'),
    spoiledCutIds: z.array(uuid).max(100).default([]),
    timeLimitSeconds: z.number().min(0.5).max(60).default(5),
  })
  .strict()
/** A damaged or miscut stick. */
export type DamageStick = z.infer<typeof DamageStickSchema>

/** A bin scanned at the cut bench for a work order. */
export const AssignBinSchema = z
  .object({ workOrderId: uuid, code: z.string().trim().min(1, 'Scan or type the bin code').max(40, 'That is not a bin code') })
  .strict()
/** A bin scanned for a work order. */
export type AssignBin = z.infer<typeof AssignBinSchema>

/** Paper of the cut sheet. */
export const CutSheetQuerySchema = z.object({ paper: z.enum(['letter', 'a4']).default('letter') })

/** Route params of a run's cut. */
export const RunCutParamsSchema = z.object({ id: uuid, cutId: uuid })
/** Route params of a run's stick. */
export const RunStickParamsSchema = z.object({ id: uuid, stickId: uuid })

