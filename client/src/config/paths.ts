import type { Role } from '@kitwright/shared/roles'

/** Every route of the app; links use `href()` so nobody writes URL strings by hand. */
export const paths = {
  signIn: { pattern: '/sign-in', href: (next?: string) => (next ? `/sign-in?next=${encodeURIComponent(next)}` : '/sign-in') },
  home: { pattern: '/', href: () => '/' },
  publicRecord: { pattern: '/record/:token', href: (token: string) => `/record/${token}` },
  scan: { pattern: '/scan', href: () => '/scan' },
  users: { pattern: '/admin/users', href: () => '/admin/users' },
  audit: { pattern: '/admin/audit', href: () => '/admin/audit' },
  settings: { pattern: '/admin/settings', href: () => '/admin/settings' },
  connectTablet: { pattern: '/admin/connect-tablet', href: () => '/admin/connect-tablet' },
  cutRuns: { pattern: '/planning/cut-runs', href: () => '/planning/cut-runs' },
  cutRun: { pattern: '/planning/cut-runs/:runId', href: (runId: string) => `/planning/cut-runs/${runId}` },
  bins: { pattern: '/admin/bins', href: () => '/admin/bins' },
  cutBench: { pattern: '/bench/cut', href: () => '/bench/cut' },
  buildBench: { pattern: '/bench/build', href: () => '/bench/build' },
  packBench: { pattern: '/bench/pack', href: () => '/bench/pack' },
  unit: { pattern: '/units/:serial', href: (serial: string) => `/units/${encodeURIComponent(serial)}` },
  kits: { pattern: '/catalog/kits', href: () => '/catalog/kits' },
  revision: { pattern: '/catalog/revisions/:revisionId', href: (revisionId: string) => `/catalog/revisions/${revisionId}` },
  parts: { pattern: '/catalog/parts', href: () => '/catalog/parts' },
  partNew: { pattern: '/catalog/parts/new', href: () => '/catalog/parts/new' },
  partsImport: { pattern: '/catalog/parts/import', href: () => '/catalog/parts/import' },
  part: { pattern: '/catalog/parts/:partId', href: (partId: string) => `/catalog/parts/${partId}` },
  unitWeights: { pattern: '/catalog/unit-weights', href: () => '/catalog/unit-weights' },
  stock: { pattern: '/catalog/stock', href: () => '/catalog/stock' },
  stockReceive: { pattern: '/catalog/stock/receive', href: () => '/catalog/stock/receive' },
  stockPart: { pattern: '/catalog/stock/:partId', href: (partId: string) => `/catalog/stock/${partId}` },
  orders: { pattern: '/orders', href: () => '/orders' },
  orderNew: { pattern: '/orders/new', href: () => '/orders/new' },
  ordersImport: { pattern: '/orders/import', href: () => '/orders/import' },
  order: { pattern: '/orders/:orderId', href: (orderId: string) => `/orders/${orderId}` },
  shortages: { pattern: '/shortages', href: () => '/shortages' },
  purchaseOrders: { pattern: '/purchasing/orders', href: (poId?: string) => (poId ? `/purchasing/orders?po=${poId}` : '/purchasing/orders') },
  suppliers: { pattern: '/purchasing/suppliers', href: () => '/purchasing/suppliers' },
  outbox: { pattern: '/outbox', href: () => '/outbox' },
  lots: { pattern: '/catalog/lots', href: () => '/catalog/lots' },
  lot: { pattern: '/catalog/lots/:lotId', href: (lotId: string) => `/catalog/lots/${lotId}` },
  returns: { pattern: '/returns', href: () => '/returns' },
  returnDetail: { pattern: '/returns/:returnId', href: (returnId: string) => `/returns/${returnId}` },
} as const

/** Where each role lands after signing in: the office roles on the home page, bench roles on their bench. */
export function landingFor(role: Role): string {
  switch (role) {
    case 'cutter':
      return paths.cutBench.href()
    case 'assembler':
      return paths.buildBench.href()
    case 'packer':
      return paths.packBench.href()
    case 'admin':
    case 'planner':
      return paths.home.href()
  }
}
