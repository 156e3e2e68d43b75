import { createBrowserRouter, type RouteObject } from 'react-router-dom'
import { paths } from '../config/paths'
import { afterSignIn, requireRole, requireUser } from './auth-guard'
import { RouteErrorBoundary } from './routes/error-boundary'
import { NotFoundPage } from './routes/not-found'
import { Root, StartingUp, title } from './routes/root'

/**
 * Every page of the app. Pages are route modules loaded with the router's own `lazy` when first
 * opened, so the first load of any page carries only the router, React, the query cache and that
 * page; each page names itself with `handle: title(…)` (shown as "Orders · Kitwright"). Pages behind
 * sign-in fetch their code only once someone is signed in (`afterSignIn`), so a tablet opening the
 * shop's address before signing in downloads the sign-in page alone.
 * The root shows `StartingUp` while the first page's code and data arrive.
 */
export const routes: RouteObject[] = [
  {
    Component: Root,
    HydrateFallback: StartingUp,
    errorElement: <RouteErrorBoundary />,
    children: [
      {
        path: paths.signIn.pattern,
        handle: title('Sign in'),
        lazy: () => import('./routes/sign-in'),
        errorElement: <RouteErrorBoundary />,
      },
      {
        // The customer's build-record link from the shipping e-mail: no sign-in, the token is the key.
        path: paths.publicRecord.pattern,
        handle: title('Build record'),
        lazy: () => import('./routes/public-record'),
        errorElement: <RouteErrorBoundary />,
      },
      {
        path: '/',
        lazy: afterSignIn(async () => ({ Component: (await import('./routes/app-shell')).AppShell })),
        errorElement: <RouteErrorBoundary />,
        loader: ({ request }) => requireUser(request),
        children: [
          {
            errorElement: <RouteErrorBoundary />,
            children: [
              {
                index: true,
                handle: title('Home'),
                lazy: afterSignIn(() => import('./routes/home')),
                loader: ({ request }) => requireRole(request, ['admin', 'planner']),
              },
              { path: paths.scan.pattern, handle: title('Scan'), lazy: afterSignIn(() => import('./routes/scan')) },
              {
                path: paths.users.pattern,
                handle: title('Users'),
                lazy: afterSignIn(() => import('./routes/admin/users')),
                loader: ({ request }) => requireRole(request, ['admin']),
              },
              {
                path: paths.audit.pattern,
                handle: title('Audit'),
                lazy: afterSignIn(() => import('./routes/admin/audit')),
                loader: ({ request }) => requireRole(request, ['admin']),
              },
              {
                path: paths.settings.pattern,
                handle: title('Settings'),
                lazy: afterSignIn(() => import('./routes/admin/settings')),
                loader: ({ request }) => requireRole(request, ['admin']),
              },
              {
                path: paths.connectTablet.pattern,
                handle: title('Connect a tablet'),
                lazy: afterSignIn(() => import('./routes/admin/connect-tablet')),
                loader: ({ request }) => requireRole(request, ['admin']),
              },
              {
                path: paths.kits.pattern,
                handle: title('Kits'),
                lazy: afterSignIn(() => import('./routes/catalog/kits')),
                loader: ({ request }) => requireRole(request, ['admin', 'planner']),
              },
              {
                path: paths.revision.pattern,
                handle: title('Kit revision'),
                lazy: afterSignIn(() => import('./routes/catalog/revision')),
                loader: ({ request }) => requireRole(request, ['admin', 'planner']),
              },
              {
                path: paths.parts.pattern,
                handle: title('Parts'),
                lazy: afterSignIn(() => import('./routes/catalog/parts')),
                loader: ({ request }) => requireRole(request, ['admin', 'planner']),
              },
              {
                path: paths.partNew.pattern,
                handle: title('New part'),
                lazy: afterSignIn(() => import('./routes/catalog/part-detail')),
                loader: ({ request }) => requireRole(request, ['admin', 'planner']),
              },
              {
                path: paths.partsImport.pattern,
                handle: title('Import parts'),
                lazy: afterSignIn(() => import('./routes/catalog/parts-import')),
                loader: ({ request }) => requireRole(request, ['admin', 'planner']),
              },
              {
                path: paths.part.pattern,
                handle: title('Part'),
                lazy: afterSignIn(() => import('./routes/catalog/part-detail')),
                loader: ({ request }) => requireRole(request, ['admin', 'planner']),
              },
              {
                path: paths.unitWeights.pattern,
                handle: title('Unit weights'),
                lazy: afterSignIn(() => import('./routes/catalog/unit-weights')),
                loader: ({ request }) => requireRole(request, ['admin', 'planner']),
              },
              {
                path: paths.stock.pattern,
                handle: title('Stock'),
                lazy: afterSignIn(() => import('./routes/catalog/stock')),
                loader: ({ request }) => requireRole(request, ['admin', 'planner']),
              },
              {
                path: paths.stockReceive.pattern,
                handle: title('Receive stock'),
                lazy: afterSignIn(() => import('./routes/catalog/stock-receive')),
                loader: ({ request }) => requireRole(request, ['admin', 'planner']),
              },
              {
                path: paths.stockPart.pattern,
                handle: title('Stock of a part'),
                lazy: afterSignIn(() => import('./routes/catalog/stock-part')),
                loader: ({ request }) => requireRole(request, ['admin', 'planner']),
              },
              {
                path: paths.orders.pattern,
                handle: title('Orders'),
                lazy: afterSignIn(() => import('./routes/orders/orders')),
                loader: ({ request }) => requireRole(request, ['admin', 'planner']),
              },
              {
                path: paths.orderNew.pattern,
                handle: title('New order'),
                lazy: afterSignIn(() => import('./routes/orders/order-new')),
                loader: ({ request }) => requireRole(request, ['admin', 'planner']),
              },
              {
                path: paths.ordersImport.pattern,
                handle: title('Import orders'),
                lazy: afterSignIn(() => import('./routes/orders/orders-import')),
                loader: ({ request }) => requireRole(request, ['admin', 'planner']),
              },
              {
                path: paths.order.pattern,
                handle: title('Order'),
                lazy: afterSignIn(() => import('./routes/orders/order-detail')),
                loader: ({ request }) => requireRole(request, ['admin', 'planner']),
              },
              {
                path: paths.shortages.pattern,
                handle: title('Shortages'),
                lazy: afterSignIn(() => import('./routes/shortages')),
                loader: ({ request }) => requireRole(request, ['admin', 'planner']),
              },
              {
                path: paths.purchaseOrders.pattern,
                handle: title('Purchase orders'),
                lazy: afterSignIn(() => import('./routes/purchasing/purchase-orders')),
                loader: ({ request }) => requireRole(request, ['admin', 'planner']),
              },
              {
                path: paths.suppliers.pattern,
                handle: title('Suppliers'),
                lazy: afterSignIn(() => import('./routes/purchasing/suppliers')),
                loader: ({ request }) => requireRole(request, ['admin', 'planner']),
              },
              {
                path: paths.lots.pattern,
                handle: title('Lots and recalls'),
                lazy: afterSignIn(() => import('./routes/lots/lots')),
                loader: ({ request }) => requireRole(request, ['admin', 'planner']),
              },
              {
                path: paths.lot.pattern,
                handle: title('Lot'),
                lazy: afterSignIn(() => import('./routes/lots/lot')),
                loader: ({ request }) => requireRole(request, ['admin', 'planner']),
              },
              {
                path: paths.outbox.pattern,
                handle: title('Outbox'),
                lazy: afterSignIn(() => import('./routes/outbox')),
                loader: ({ request }) => requireRole(request, ['admin', 'planner']),
              },
              {
                path: paths.cutRuns.pattern,
                handle: title('Cut runs'),
                lazy: afterSignIn(() => import('./routes/planning/cut-runs')),
                loader: ({ request }) => requireRole(request, ['admin', 'planner']),
              },
              {
                path: paths.cutRun.pattern,
                handle: title('Cut run'),
                lazy: afterSignIn(() => import('./routes/planning/cut-run')),
                loader: ({ request }) => requireRole(request, ['admin', 'planner']),
              },
              {
                path: paths.bins.pattern,
                handle: title('Bins'),
                lazy: afterSignIn(() => import('./routes/admin/bins')),
                loader: ({ request }) => requireRole(request, ['admin', 'planner']),
              },
              {
                path: paths.cutBench.pattern,
                handle: title('Cut bench'),
                lazy: afterSignIn(() => import('./routes/bench/cut')),
                loader: ({ request }) => requireRole(request, ['admin', 'planner', 'cutter']),
              },
              {
                path: paths.buildBench.pattern,
                handle: title('Build bench'),
                lazy: afterSignIn(() => import('./routes/bench/build')),
                loader: ({ request }) => requireRole(request, ['admin', 'planner', 'assembler']),
              },
              {
                path: paths.packBench.pattern,
                handle: title('Pack bench'),
                lazy: afterSignIn(() => import('./routes/bench/pack')),
                loader: ({ request }) => requireRole(request, ['admin', 'planner', 'packer']),
              },
              {
                path: paths.returns.pattern,
                handle: title('Returns'),
                lazy: afterSignIn(() => import('./routes/returns/returns')),
                loader: ({ request }) => requireRole(request, ['admin', 'planner', 'packer']),
              },
              {
                path: paths.returnDetail.pattern,
                handle: title('Return'),
                lazy: afterSignIn(() => import('./routes/returns/return-detail')),
                loader: ({ request }) => requireRole(request, ['admin', 'planner', 'packer']),
              },
              {
                path: paths.unit.pattern,
                handle: title('Unit'),
                lazy: afterSignIn(() => import('./routes/units/unit')),
                loader: ({ request }) => requireRole(request, ['admin', 'planner', 'assembler', 'packer']),
              },
              { path: '*', handle: title('Page not found'), element: <NotFoundPage /> },
            ],
          },
        ],
      },
    ],
  },
]

export const router = createBrowserRouter(routes)
