import { useQuery } from '@tanstack/react-query'
import { NavLink, Outlet, useNavigate } from 'react-router-dom'
import { Toaster } from 'sonner'
import type { Role } from '@kitwright/shared/roles'
import { ROLE_LABELS } from '@kitwright/shared/roles'
import { Button } from '../../components/ui/button'
import { OfflineBanner } from '../../components/ui/offline-banner'
import { paths } from '../../config/paths'
import { meOptions, useSignOut } from '../../features/auth/api/auth-queries'
import { cn } from '../../lib/cn'

const NAV: { label: string; href: string; roles: readonly Role[] }[] = [
  { label: 'Home', href: paths.home.href(), roles: ['admin', 'planner'] },
  { label: 'Orders', href: paths.orders.href(), roles: ['admin', 'planner'] },
  { label: 'Parts', href: paths.parts.href(), roles: ['admin', 'planner'] },
  { label: 'Kits', href: paths.kits.href(), roles: ['admin', 'planner'] },
  { label: 'Stock', href: paths.stock.href(), roles: ['admin', 'planner'] },
  { label: 'Unit weights', href: paths.unitWeights.href(), roles: ['admin', 'planner'] },
  { label: 'Lots & recalls', href: paths.lots.href(), roles: ['admin', 'planner'] },
  { label: 'Shortages', href: paths.shortages.href(), roles: ['admin', 'planner'] },
  { label: 'Purchase orders', href: paths.purchaseOrders.href(), roles: ['admin', 'planner'] },
  { label: 'Suppliers', href: paths.suppliers.href(), roles: ['admin', 'planner'] },
  { label: 'Outbox', href: paths.outbox.href(), roles: ['admin', 'planner'] },
  { label: 'Cut runs', href: paths.cutRuns.href(), roles: ['admin', 'planner'] },
  { label: 'Bins', href: paths.bins.href(), roles: ['admin', 'planner'] },
  { label: 'Cut bench', href: paths.cutBench.href(), roles: ['admin', 'planner', 'cutter'] },
  { label: 'Build bench', href: paths.buildBench.href(), roles: ['admin', 'planner', 'assembler'] },
  { label: 'Pack bench', href: paths.packBench.href(), roles: ['admin', 'planner', 'packer'] },
  { label: 'Returns', href: paths.returns.href(), roles: ['admin', 'planner', 'packer'] },
  { label: 'Scan', href: paths.scan.href(), roles: ['admin', 'planner', 'cutter', 'assembler', 'packer'] },
  { label: 'Users', href: paths.users.href(), roles: ['admin'] },
  { label: 'Audit', href: paths.audit.href(), roles: ['admin'] },
  { label: 'Settings', href: paths.settings.href(), roles: ['admin'] },
  { label: 'Tablets', href: paths.connectTablet.href(), roles: ['admin'] },
]

export function AppShell() {
  const { data: me } = useQuery(meOptions())
  const signOut = useSignOut()
  const navigate = useNavigate()
  if (!me) return null
  const items = NAV.filter((n) => n.roles.includes(me.role))
  // The office sees many pages; the benches see two, and keep their large touch targets.
  const dense = items.length > 6
  return (
    <div className="min-h-screen">
      <header className="bg-brand-900 text-white">
        <div className="mx-auto flex max-w-screen-2xl flex-wrap items-center gap-x-4 gap-y-2 px-4 py-3">
          <span className="text-2xl font-bold tracking-wide">Kitwright</span>
          <nav aria-label="Main" className="flex flex-wrap gap-1">
            {items.map((n) => (
              <NavLink
                key={n.href}
                to={n.href}
                end={n.href === '/'}
                className={({ isActive }) => cn('rounded-md py-2 font-bold', dense ? 'px-2 text-base' : 'px-3 text-lg', isActive ? 'bg-white text-brand-900' : 'hover:bg-brand-700')}
              >
                {n.label}
              </NavLink>
            ))}
          </nav>
          <div className="ml-auto flex items-center gap-3">
            <span className="text-right leading-tight">
              <span className="block font-bold">{me.name}</span>
              <span className="block text-sm text-brand-100">{ROLE_LABELS[me.role]}</span>
            </span>
            {/* At least 48 px tall like every other bench target (gloved hands sign out too). */}
            <Button
              variant="secondary"
              className="min-h-12"
              onClick={() => signOut.mutate(undefined, { onSuccess: () => void navigate(paths.signIn.href()) })}
            >
              Sign out
            </Button>
          </div>
        </div>
      </header>
      <OfflineBanner userId={me.id} />
      <main className="mx-auto max-w-7xl px-4 py-6">
        <Outlet />
      </main>
      {/* Toasts are for signed-in work only; here, the sign-in page does not download them. */}
      <Toaster position="top-center" richColors closeButton toastOptions={{ className: 'text-base' }} />
    </div>
  )
}
