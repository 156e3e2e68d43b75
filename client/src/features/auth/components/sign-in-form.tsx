import { zodResolver } from '@hookform/resolvers/zod'
import { useState } from 'react'
import { useForm } from 'react-hook-form'
import type { z } from 'zod'
import { PasswordSignInSchema, PinSignInSchema, type Me } from '@kitwright/shared/auth'
import { Button } from '../../../components/ui/button'
import { Field, Input } from '../../../components/ui/field'
import { ApiError } from '../../../lib/api-client'
import { cn } from '../../../lib/cn'
import { useSignIn } from '../api/auth-queries'

type Mode = 'password' | 'pin'

/** Sign-in by password or bench PIN; `initialMode` 'pin' is for tablets at a bench (the QR code's address). */
export function SignInForm({ onSignedIn, initialMode = 'password' }: { onSignedIn: (me: Me) => void; initialMode?: Mode }) {
  const [mode, setMode] = useState<Mode>(initialMode)
  return (
    <div className="space-y-5">
      <div role="tablist" aria-label="How to sign in" className="grid grid-cols-2 gap-2">
        {(['password', 'pin'] as const).map((m) => (
          <button
            key={m}
            role="tab"
            type="button"
            aria-selected={mode === m}
            onClick={() => setMode(m)}
            className={cn('h-12 rounded-md border font-bold', mode === m ? 'border-brand-700 bg-brand-50 text-brand-900' : 'border-stone-300 bg-white')}
          >
            {m === 'password' ? 'Password' : 'Bench PIN'}
          </button>
        ))}
      </div>
      {mode === 'password' ? <PasswordForm onSignedIn={onSignedIn} /> : <PinForm onSignedIn={onSignedIn} />}
    </div>
  )
}

function useSubmit(onSignedIn: (me: Me) => void) {
  const signIn = useSignIn()
  const [error, setError] = useState<string | null>(null)
  const submit = (input: z.infer<typeof PasswordSignInSchema> | z.infer<typeof PinSignInSchema>) => {
    setError(null)
    signIn.mutate(input, {
      onSuccess: onSignedIn,
      onError: (err) => setError(err instanceof ApiError ? err.message : 'Could not reach Kitwright; check the connection'),
    })
  }
  return { submit, error, pending: signIn.isPending }
}

function FormError({ error }: { error: string | null }) {
  if (!error) return null
  return (
    <p role="alert" className="rounded-md border border-red-300 bg-red-50 p-3 text-red-800">
      {error}
    </p>
  )
}

function PasswordForm({ onSignedIn }: { onSignedIn: (me: Me) => void }) {
  const form = useForm({ resolver: zodResolver(PasswordSignInSchema), defaultValues: { email: '', password: '' } })
  const { submit, error, pending } = useSubmit(onSignedIn)
  const { errors } = form.formState
  return (
    <form onSubmit={form.handleSubmit(submit)} className="space-y-4" noValidate>
      <Field label="E-mail" error={errors.email?.message}>
        <Input type="email" autoComplete="username" aria-invalid={!!errors.email} {...form.register('email')} />
      </Field>
      <Field label="Password" error={errors.password?.message}>
        <Input type="password" autoComplete="current-password" aria-invalid={!!errors.password} {...form.register('password')} />
      </Field>
      <FormError error={error} />
      <Button type="submit" size="bench" className="w-full" disabled={pending}>
        {pending ? 'Signing in…' : 'Sign in'}
      </Button>
    </form>
  )
}

function PinForm({ onSignedIn }: { onSignedIn: (me: Me) => void }) {
  const form = useForm({ resolver: zodResolver(PinSignInSchema), defaultValues: { email: '', pin: '' } })
  const { submit, error, pending } = useSubmit(onSignedIn)
  const { errors } = form.formState
  return (
    <form onSubmit={form.handleSubmit(submit)} className="space-y-4" noValidate>
      <Field label="E-mail" error={errors.email?.message}>
        <Input type="email" autoComplete="username" aria-invalid={!!errors.email} {...form.register('email')} />
      </Field>
      <Field label="Bench PIN" error={errors.pin?.message}>
        <Input type="password" inputMode="numeric" autoComplete="off" aria-invalid={!!errors.pin} className="h-14 text-2xl tracking-widest" {...form.register('pin')} />
      </Field>
      <FormError error={error} />
      <Button type="submit" size="bench" className="w-full" disabled={pending}>
        {pending ? 'Signing in…' : 'Sign in at the bench'}
      </Button>
    </form>
  )
}
