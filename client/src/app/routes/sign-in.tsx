import { useNavigate, useSearchParams } from 'react-router-dom'
import type { BenchDevice } from '@kitwright/shared/auth'
import type { Role } from '@kitwright/shared/roles'
import { landingFor, paths } from '../../config/paths'
import { deviceBench } from '../../lib/bench-device'

const BENCH_ROLE: Record<BenchDevice, Role> = { cut: 'cutter', build: 'assembler', pack: 'packer' }
const BENCH_PATH: Record<BenchDevice, string> = { cut: paths.cutBench.href(), build: paths.buildBench.href(), pack: paths.packBench.href() }
import { SignInForm } from '../../features/auth/components/sign-in-form'

export function Component() {
  const navigate = useNavigate()
  const [params] = useSearchParams()
  const next = params.get('next')
  const bench = deviceBench()
  return (
    <div className="flex min-h-screen items-center justify-center p-4">
      <div className="w-full max-w-md space-y-6 rounded-xl border border-stone-300 bg-white p-8 shadow-sm">
        <div>
          <h1 className="text-4xl font-bold text-brand-900">Kitwright</h1>
          <p className="text-stone-600">Sign in to your shop</p>
        </div>
        <SignInForm
          // `?with=pin` (BENCH_SIGN_IN_PATH, the tablets' QR code) or a device that is a bench opens the bench PIN form.
          initialMode={params.get('with') === 'pin' || bench ? 'pin' : 'password'}
          onSignedIn={(me) => {
            // A bench tablet opens its bench for whoever may work there; else each role's own landing page.
            const home = bench && (me.role === BENCH_ROLE[bench] || me.role === 'admin' || me.role === 'planner') ? BENCH_PATH[bench] : landingFor(me.role)
            // Only follow a same-site path, never an address someone put in the link.
            const target = next && next.startsWith('/') && !next.startsWith('//') ? next : home
            void navigate(target, { replace: true })
          }}
        />
      </div>
    </div>
  )
}
