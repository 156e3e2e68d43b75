import { useNavigate, useSearchParams } from 'react-router-dom'
import { landingFor } from '../../config/paths'
import { SignInForm } from '../../features/auth/components/sign-in-form'

export function Component() {
  const navigate = useNavigate()
  const [params] = useSearchParams()
  const next = params.get('next')
  return (
    <div className="flex min-h-screen items-center justify-center p-4">
      <div className="w-full max-w-md space-y-6 rounded-xl border border-stone-300 bg-white p-8 shadow-sm">
        <div>
          <h1 className="text-4xl font-bold text-brand-900">Kitwright</h1>
          <p className="text-stone-600">Sign in to your shop</p>
        </div>
        <SignInForm
          // `?with=pin` (BENCH_SIGN_IN_PATH, the tablets' QR code) opens the bench PIN form.
          initialMode={params.get('with') === 'pin' ? 'pin' : 'password'}
          onSignedIn={(me) => {
            // Only follow a same-site path, never an address someone put in the link.
            const target = next && next.startsWith('/') && !next.startsWith('//') ? next : landingFor(me.role)
            void navigate(target, { replace: true })
          }}
        />
      </div>
    </div>
  )
}
