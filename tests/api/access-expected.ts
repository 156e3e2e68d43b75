import { ROLES, type Role } from '@kitwright/shared/roles'

/**
 * Who may call each route, written by hand from what each person does in the shop (DESIGN.md
 * "People and benches", README "Demo sign-ins"), NOT read from the route table: the access test
 * compares the route table and the running server with this grid, so a wrong rule in the table fails.
 *
 * - signed out: only what a stranger must reach: health, signing in (and the bench-PIN name list a
 *   tablet shows before anyone signs in), the customer's payment and build-record links, the
 *   tablet's CA certificate, and the webhooks that prove themselves with a signature of their own.
 * - admin (the owner): everything a planner does, plus users, shop settings, the audit trail and
 *   connecting tablets.
 * - planner (the office): catalog, orders, release, shortages, cut-run planning, purchasing,
 *   outbox, reports, small parts' unit weights (weighing counted samples); covers any bench when someone is out.
 * - cutter: the cut bench (published runs, ticks, damaged sticks, offcut labels, dropping pieces
 *   into bins and printing bin labels); reads the catalog (without part costs, which are the office's), stock and settings.
 * - assembler: the build bench (steps, photos, leak test, the lot of each lot-tracked part) and a unit's build record; reads as above.
 * - packer: the pack bench (verify, weigh hardware bags, quote, label, ship, void its own label, papers, customs) and a
 *   unit's build record; shipping an order short is the office's call, not the packer's. Returns
 *   come back to the pack bench: the packer reads them, receives the parcel and photographs what came
 *   back; opening a return, buying its label (money) and deciding repair, replace or refund are the
 *   office's, and so is recording what becomes of a replaced or refunded unit (spare or scrapped); the
 *   list of return reasons is a shop setting, the owner's.
 *
 * Every route Express has needs a line here; a new route without one fails tests/api/access.test.ts
 * until someone decides, route by route, who should call it. `y` = let through, `-` = refused
 * (401 signed out, 403 for a signed-in role).
 */
const GRID = `
method path                                                    signed-out admin planner cutter assembler packer
get    /api/health                                             y          y     y       y      y         y
post   /api/auth/sign-in                                       y          y     y       y      y         y
get    /api/auth/bench-people                                  y          y     y       y      y         y
post   /api/auth/sign-out                                      y          y     y       y      y         y
get    /api/auth/me                                            y          y     y       y      y         y

get    /api/users                                              -          y     -       -      -         -
post   /api/users                                              -          y     -       -      -         -
patch  /api/users/:id                                          -          y     -       -      -         -
post   /api/users/:id/credentials                              -          y     -       -      -         -
get    /api/settings                                           -          y     y       y      y         y
patch  /api/settings                                           -          y     -       -      -         -
get    /api/settings/identity                                  -          y     -       -      -         -
put    /api/settings/identity                                  -          y     -       -      -         -
get    /api/audit                                              -          y     -       -      -         -
get    /api/tablets/connect                                    -          y     -       -      -         -
get    /api/tablets/sign-in-qr.svg                             -          y     -       -      -         -
get    /api/tablets/ca-certificate-qr.svg                      -          y     -       -      -         -
get    /api/tablets/ca-certificate.crt                         y          y     y       y      y         y

get    /api/scan/:code                                         -          y     y       y      y         y

get    /api/parts                                              -          y     y       y      y         y
get    /api/parts/export.csv                                   -          y     y       y      y         y
get    /api/parts/:id                                          -          y     y       y      y         y
post   /api/parts/import/preview                               -          y     y       -      -         -
post   /api/parts/import                                       -          y     y       -      -         -
post   /api/parts                                              -          y     y       -      -         -
patch  /api/parts/:id                                          -          y     y       -      -         -
get    /api/kits                                               -          y     y       y      y         y
get    /api/kits/:id                                           -          y     y       y      y         y
post   /api/kits                                               -          y     y       -      -         -
put    /api/kits/:id/price                                     -          y     y       -      -         -
post   /api/kits/:id/revisions                                 -          y     y       -      -         -
get    /api/revisions/:id                                      -          y     y       y      y         y
put    /api/revisions/:id                                      -          y     y       -      -         -
post   /api/revisions/:id/release                              -          y     y       -      -         -
post   /api/revisions/:id/retire                               -          y     y       -      -         -

get    /api/stock                                              -          y     y       y      y         y
get    /api/stock/export.csv                                   -          y     y       y      y         y
get    /api/stock/parts                                        -          y     y       y      y         y
get    /api/stock/moves                                        -          y     y       y      y         y
post   /api/stock/receive                                      -          y     y       -      -         -
post   /api/stock/receive/preview                              -          y     y       -      -         -
post   /api/stock/receive/csv                                  -          y     y       -      -         -
post   /api/stock/adjust                                       -          y     y       -      -         -
post   /api/stock/reserve                                      -          y     y       -      -         -
post   /api/stock/release                                      -          y     y       -      -         -
get    /api/suppliers                                          -          y     y       -      -         -
post   /api/suppliers                                          -          y     y       -      -         -
get    /api/suppliers/:id                                      -          y     y       -      -         -
put    /api/suppliers/:id                                      -          y     y       -      -         -
put    /api/suppliers/:id/parts/:partId                        -          y     y       -      -         -
delete /api/suppliers/:id/parts/:partId                        -          y     y       -      -         -
get    /api/purchase-orders                                    -          y     y       -      -         -
post   /api/purchase-orders/from-shortages                     -          y     y       -      -         -
get    /api/purchase-orders/:id                                -          y     y       -      -         -
put    /api/purchase-orders/:id                                -          y     y       -      -         -
get    /api/purchase-orders/:id/pdf                            -          y     y       -      -         -
post   /api/purchase-orders/:id/send                           -          y     y       -      -         -
post   /api/purchase-orders/:id/cancel                         -          y     y       -      -         -

post   /api/webhooks/store                                     y          y     y       y      y         y
get    /api/mail                                               -          y     y       -      -         -
get    /api/mail/:id                                           -          y     y       -      -         -
post   /api/mail/:id/resend                                    -          y     y       -      -         -

get    /api/orders                                             -          y     y       -      -         -
get    /api/orders/export.csv                                  -          y     y       -      -         -
post   /api/orders/import/preview                              -          y     y       -      -         -
post   /api/orders/import                                      -          y     y       -      -         -
get    /api/orders/:id                                         -          y     y       -      -         -
patch  /api/orders/:id                                         -          y     y       -      -         -
post   /api/orders/:id/hold                                    -          y     y       -      -         -
delete /api/orders/:id/hold                                    -          y     y       -      -         -
post   /api/orders/:id/cancel                                  -          y     y       -      -         -
post   /api/orders                                             -          y     y       -      -         -
get    /api/orders/:id/payments                                -          y     y       -      -         -
post   /api/orders/:id/payments                                -          y     y       -      -         -
post   /api/orders/:id/payment-links                           -          y     y       -      -         -
get    /api/pay/thanks                                         y          y     y       y      y         y
get    /api/pay/:token                                         y          y     y       y      y         y
post   /api/webhooks/payments                                  y          y     y       y      y         y
post   /api/orders/release                                     -          y     y       -      -         -
post   /api/orders/release/preview                             -          y     y       -      -         -
get    /api/shortages                                          -          y     y       -      -         -

get    /api/cut-runs                                           -          y     y       y      -         -
get    /api/cut-runs/worklist                                  -          y     y       y      -         -
get    /api/cut-runs/candidates                                -          y     y       -      -         -
get    /api/cut-runs/stock                                     -          y     y       -      -         -
post   /api/cut-runs                                           -          y     y       -      -         -
get    /api/cut-runs/:id                                       -          y     y       y      -         -
post   /api/cut-runs/:id/publish                               -          y     y       -      -         -
post   /api/cut-runs/:id/cancel                                -          y     y       -      -         -
post   /api/cut-runs/:id/replan                                -          y     y       -      -         -
get    /api/cut-runs/:id/cut-sheet.pdf                         -          y     y       y      -         -
post   /api/cut-runs/:id/cuts/:cutId/tick                      -          y     y       y      -         -
post   /api/cut-runs/:id/cuts/:cutId/undo                      -          y     y       y      -         -
post   /api/cut-runs/:id/sticks/:stickId/damage                -          y     y       y      -         -
get    /api/cut-runs/:id/sticks/:stickId/offcut-label.pdf      -          y     y       y      -         -
post   /api/cut-runs/:id/bins                                  -          y     y       y      -         -
get    /api/bins                                               -          y     y       -      -         -
post   /api/bins                                               -          y     y       -      -         -
get    /api/bins/labels.pdf                                    -          y     y       y      -         -

get    /api/build/out-of-limits                                -          y     y       -      -         -
get    /api/build/worklist                                     -          y     y       -      y         -
get    /api/build/lookup                                       -          y     y       -      y         -
post   /api/build/:workOrderId/steps/:stepId/tick              -          y     y       -      y         -
post   /api/build/:workOrderId/steps/:stepId/undo              -          y     y       -      y         -
post   /api/build/:workOrderId/photos/presign                  -          y     y       -      y         -
post   /api/build/:workOrderId/photos/confirm                  -          y     y       -      y         -
post   /api/build/:workOrderId/leak-tests                      -          y     y       -      y         -
post   /api/build/:workOrderId/lots                            -          y     y       -      y         -
post   /api/build/:workOrderId/lots/:fitId/undo                -          y     y       -      y         -
get    /api/lots                                               -          y     y       -      -         -
get    /api/lots/:lotId                                        -          y     y       -      -         -
get    /api/lots/:lotId/recall.csv                             -          y     y       -      -         -
post   /api/lots/:lotId/notify                                 -          y     y       -      -         -
get    /api/units/:serial                                      -          y     y       -      y         y
get    /api/public/unit-records/:token                         y          y     y       y      y         y

get    /api/pack/worklist                                      -          y     y       -      -         y
get    /api/pack/lookup                                        -          y     y       -      -         y
get    /api/pack/orders/:orderId                               -          y     y       -      -         y
post   /api/pack/orders/:orderId/scan                          -          y     y       -      -         y
post   /api/pack/orders/:orderId/tick                          -          y     y       -      -         y
post   /api/pack/orders/:orderId/undo                          -          y     y       -      -         y
post   /api/pack/orders/:orderId/approve-partial               -          y     y       -      -         -
post   /api/pack/orders/:orderId/quote                         -          y     y       -      -         y
post   /api/pack/orders/:orderId/label                         -          y     y       -      -         y
post   /api/pack/orders/:orderId/ship                          -          y     y       -      -         y
get    /api/shipments/:shipmentId/packing-slip.pdf             -          y     y       -      -         y
post   /api/shipments/:shipmentId/void-label                   -          y     y       -      -         y
post   /api/shipments/tracking-events                          y          y     y       y      y         y
get    /api/shipments/:shipmentId/label.pdf                    -          y     y       -      -         y
get    /api/shipments/:shipmentId/customs                      -          y     y       -      -         y
get    /api/shipments/:shipmentId/customs-declaration.pdf      -          y     y       -      -         y

get    /api/returns/reasons                                    -          y     y       -      -         y
put    /api/returns/reasons                                    -          y     -       -      -         -
get    /api/returns/summary                                    -          y     y       -      -         -
get    /api/returns/lookup                                     -          y     y       -      -         -
get    /api/returns/units/:serial                              -          y     y       -      y         y
get    /api/returns                                            -          y     y       -      -         y
post   /api/returns                                            -          y     y       -      -         -
post   /api/returns/receive                                    -          y     y       -      -         y
get    /api/returns/:returnId                                  -          y     y       -      -         y
post   /api/returns/:returnId/label                            -          y     y       -      -         -
get    /api/returns/:returnId/label.pdf                        -          y     y       -      -         y
post   /api/returns/:returnId/photos/presign                   -          y     y       -      -         y
post   /api/returns/:returnId/photos/confirm                   -          y     y       -      -         y
post   /api/returns/:returnId/decision                         -          y     y       -      -         -
post   /api/returns/:returnId/disposition                      -          y     y       -      -         -

get    /api/unit-weights                                       -          y     y       -      -         y
get    /api/unit-weights/:partId                               -          y     y       -      -         -
post   /api/unit-weights/:partId                               -          y     y       -      -         -
get    /api/bags/orders/:orderId                               -          y     y       -      -         y
post   /api/bags/orders/:orderId/weigh                         -          y     y       -      -         y
get    /api/bags/orders/:orderId/label.pdf                     -          y     y       -      -         y

get    /api/reports/order-states                               -          y     y       -      -         -
get    /api/reports/order-states/export.csv                    -          y     y       -      -         -
get    /api/reports/late-orders                                -          y     y       -      -         -
get    /api/reports/late-orders/export.csv                     -          y     y       -      -         -
get    /api/reports/work-in-progress                           -          y     y       -      -         -
get    /api/reports/work-in-progress/export.csv                -          y     y       -      -         -
get    /api/reports/shortages/export.csv                       -          y     y       -      -         -
get    /api/reports/throughput                                 -          y     y       -      -         -
get    /api/reports/throughput/export.csv                      -          y     y       -      -         -
get    /api/reports/cut-run-yield                              -          y     y       -      -         -
get    /api/reports/cut-run-yield/export.csv                   -          y     y       -      -         -
get    /api/reports/yield-over-time                            -          y     y       -      -         -
get    /api/reports/yield-over-time/export.csv                 -          y     y       -      -         -
get    /api/reports/first-pass-yield                           -          y     y       -      -         -
get    /api/reports/first-pass-yield/export.csv                -          y     y       -      -         -
get    /api/reports/lead-time                                  -          y     y       -      -         -
get    /api/reports/lead-time/export.csv                       -          y     y       -      -         -
`

export type Caller = Role | 'signed-out'
/** The grid's columns after method and path, in order. */
export const CALLERS: readonly Caller[] = ['signed-out', 'admin', 'planner', 'cutter', 'assembler', 'packer']

/** `get /api/parts` → who may call it. */
export type ExpectedAccess = ReadonlyMap<string, ReadonlySet<Caller>>

export function parseGrid(grid: string): ExpectedAccess {
  const lines = grid.split('\n').map((l) => l.trim()).filter((l) => l !== '')
  const [head, ...rows] = lines
  const columns = head!.split(/\s+/).slice(2)
  if (columns.join(' ') !== CALLERS.join(' ')) throw new Error(`access grid columns are ${columns.join(' ')}, expected ${CALLERS.join(' ')}`)
  if (CALLERS.length !== ROLES.length + 1 || !ROLES.every((r) => CALLERS.includes(r))) throw new Error('the access grid must have a column for every role')
  const out = new Map<string, Set<Caller>>()
  for (const row of rows) {
    const [method, path, ...marks] = row.split(/\s+/)
    const key = `${method} ${path}`
    if (marks.length !== CALLERS.length || !marks.every((m) => m === 'y' || m === '-')) throw new Error(`access grid row "${row}": give y or - for each of ${CALLERS.join(', ')}`)
    if (out.has(key)) throw new Error(`access grid names ${key} twice`)
    out.set(key, new Set(CALLERS.filter((_, i) => marks[i] === 'y')))
  }
  return out
}

export const EXPECTED_ACCESS: ExpectedAccess = parseGrid(GRID)
