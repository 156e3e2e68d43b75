import { createBrowserRouter } from 'react-router-dom'
import { paths } from '../config/paths'
import { requireRole, requireUser } from './auth-guard'
import { AppShell } from './routes/app-shell'
import { RouteErrorBoundary } from './routes/error-boundary'
import { NotFoundPage } from './routes/not-found'

export const router = createBrowserRouter([
  {
    path: paths.signIn.pattern,
    lazy: () => import('./routes/sign-in'),
    errorElement: <RouteErrorBoundary />,
  },
  {
    // The customer's build-record link from the shipping e-mail: no sign-in, the token is the key.
    path: paths.publicRecord.pattern,
    lazy: () => import('./routes/public-record'),
    errorElement: <RouteErrorBoundary />,
  },
  {
    path: '/',
    element: <AppShell />,
    errorElement: <RouteErrorBoundary />,
    loader: ({ request }) => requireUser(request),
    children: [
      {
        errorElement: <RouteErrorBoundary />,
        children: [
          { index: true, lazy: () => import('./routes/home'), loader: ({ request }) => requireRole(request, ['admin', 'planner']) },
          { path: paths.scan.pattern, lazy: () => import('./routes/scan') },
          { path: paths.users.pattern, lazy: () => import('./routes/admin/users'), loader: ({ request }) => requireRole(request, ['admin']) },
          { path: paths.audit.pattern, lazy: () => import('./routes/admin/audit'), loader: ({ request }) => requireRole(request, ['admin']) },
          { path: paths.settings.pattern, lazy: () => import('./routes/admin/settings'), loader: ({ request }) => requireRole(request, ['admin']) },
          { path: paths.connectTablet.pattern, lazy: () => import('./routes/admin/connect-tablet'), loader: ({ request }) => requireRole(request, ['admin']) },
          { path: paths.kits.pattern, lazy: () => import('./routes/catalog/kits'), loader: ({ request }) => requireRole(request, ['admin', 'planner']) },
          { path: paths.revision.pattern, lazy: () => import('./routes/catalog/revision'), loader: ({ request }) => requireRole(request, ['admin', 'planner']) },
          { path: paths.parts.pattern, lazy: () => import('./routes/catalog/parts'), loader: ({ request }) => requireRole(request, ['admin', 'planner']) },
          { path: paths.partNew.pattern, lazy: () => import('./routes/catalog/part-detail'), loader: ({ request }) => requireRole(request, ['admin', 'planner']) },
          { path: paths.partsImport.pattern, lazy: () => import('./routes/catalog/parts-import'), loader: ({ request }) => requireRole(request, ['admin', 'planner']) },
          { path: paths.part.pattern, lazy: () => import('./routes/catalog/part-detail'), loader: ({ request }) => requireRole(request, ['admin', 'planner']) },
          { path: paths.stock.pattern, lazy: () => import('./routes/catalog/stock'), loader: ({ request }) => requireRole(request, ['admin', 'planner']) },
          { path: paths.stockReceive.pattern, lazy: () => import('./routes/catalog/stock-receive'), loader: ({ request }) => requireRole(request, ['admin', 'planner']) },
          { path: paths.stockPart.pattern, lazy: () => import('./routes/catalog/stock-part'), loader: ({ request }) => requireRole(request, ['admin', 'planner']) },
          { path: paths.orders.pattern, lazy: () => import('./routes/orders/orders'), loader: ({ request }) => requireRole(request, ['admin', 'planner']) },
          { path: paths.orderNew.pattern, lazy: () => import('./routes/orders/order-new'), loader: ({ request }) => requireRole(request, ['admin', 'planner']) },
          { path: paths.ordersImport.pattern, lazy: () => import('./routes/orders/orders-import'), loader: ({ request }) => requireRole(request, ['admin', 'planner']) },
          { path: paths.order.pattern, lazy: () => import('./routes/orders/order-detail'), loader: ({ request }) => requireRole(request, ['admin', 'planner']) },
          { path: paths.shortages.pattern, lazy: () => import('./routes/shortages'), loader: ({ request }) => requireRole(request, ['admin', 'planner']) },
          { path: paths.outbox.pattern, lazy: () => import('./routes/outbox'), loader: ({ request }) => requireRole(request, ['admin', 'planner']) },
          { path: paths.cutRuns.pattern, lazy: () => import('./routes/planning/cut-runs'), loader: ({ request }) => requireRole(request, ['admin', 'planner']) },
          { path: paths.cutRun.pattern, lazy: () => import('./routes/planning/cut-run'), loader: ({ request }) => requireRole(request, ['admin', 'planner']) },
          { path: paths.bins.pattern, lazy: () => import('./routes/admin/bins'), loader: ({ request }) => requireRole(request, ['admin', 'planner']) },
          { path: paths.cutBench.pattern, lazy: () => import('./routes/bench/cut'), loader: ({ request }) => requireRole(request, ['admin', 'planner', 'cutter']) },
          { path: paths.buildBench.pattern, lazy: () => import('./routes/bench/build'), loader: ({ request }) => requireRole(request, ['admin', 'planner', 'assembler']) },
          { path: paths.packBench.pattern, lazy: () => import('./routes/bench/pack'), loader: ({ request }) => requireRole(request, ['admin', 'planner', 'packer']) },
          { path: paths.unit.pattern, lazy: () => import('./routes/units/unit'), loader: ({ request }) => requireRole(request, ['admin', 'planner', 'assembler', 'packer']) },
          { path: '*', element: <NotFoundPage /> },
        ],
      },
    ],
  },
])
