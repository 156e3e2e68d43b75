import { useState, type ChangeEvent } from 'react'
import { BenchPinSignInSchema, PasswordSignInSchema, type BenchPerson, type Me, type SignIn } from '@kitwright/shared/auth'
import { Button } from '../../../components/ui/button'
import { Field, Input } from '../../../components/ui/field'
import { ApiError } from '../../../lib/api-client'
import { cn } from '../../../lib/cn'
import { useQuery } from '@tanstack/react-query'
import { useDeviceBench } from '../../../components/ui/bench-device-toggle'
import { BENCH_NAMES } from '../../../lib/bench-device'
import { benchPeopleOptions, useSignIn } from '../api/auth-queries'

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
  const submit = (input: SignIn) => {
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

/**
 * E-mail and password, checked with the shared schema before sending. Plain state rather than
 * react-hook-form: this page is the first load on every tablet, and two fields do not need it.
 */
function PasswordForm({ onSignedIn }: { onSignedIn: (me: Me) => void }) {
  const [values, setValues] = useState({ email: '', password: '' })
  const [errors, setErrors] = useState<Partial<Record<'email' | 'password', string>>>({})
  const { submit, error, pending } = useSubmit(onSignedIn)
  const set = (name: 'email' | 'password') => (e: ChangeEvent<HTMLInputElement>) => setValues((v) => ({ ...v, [name]: e.target.value }))
  return (
    <form
      className="space-y-4"
      noValidate
      onSubmit={(e) => {
        e.preventDefault()
        const parsed = PasswordSignInSchema.safeParse(values)
        if (!parsed.success) {
          const found: typeof errors = {}
          for (const issue of parsed.error.issues) {
            const field = issue.path[0]
            if ((field === 'email' || field === 'password') && !found[field]) found[field] = issue.message
          }
          setErrors(found)
          return
        }
        setErrors({})
        submit(parsed.data)
      }}
    >
      <Field label="E-mail" error={errors.email}>
        <Input type="email" name="email" autoComplete="username" aria-invalid={!!errors.email} value={values.email} onChange={set('email')} />
      </Field>
      <Field label="Password" error={errors.password}>
        <Input type="password" name="password" autoComplete="current-password" aria-invalid={!!errors.password} value={values.password} onChange={set('password')} />
      </Field>
      <FormError error={error} />
      <Button type="submit" size="bench" className="w-full" disabled={pending}>
        {pending ? 'Signing in…' : 'Sign in'}
      </Button>
    </form>
  )
}

/**
 * The bench sign-in: pick your name from this bench's people (big buttons, no e-mail), then type
 * your PIN. On a device that is no bench yet, every bench's people are listed.
 */
function PinForm({ onSignedIn }: { onSignedIn: (me: Me) => void }) {
  const bench = useDeviceBench()
  const people = useQuery(benchPeopleOptions(bench))
  const [person, setPerson] = useState<BenchPerson | null>(null)
  const [pin, setPin] = useState('')
  const [pinError, setPinError] = useState<string | null>(null)
  const { submit, error, pending } = useSubmit(onSignedIn)
  if (!person) {
    return (
      <div className="space-y-3">
        <p className="text-lg font-bold">{bench ? `Who is at the ${BENCH_NAMES[bench]}?` : 'Who are you?'}</p>
        {people.isError && <FormError error={people.error.message} />}
        {people.data?.length === 0 && <p>Nobody here has a bench PIN yet; the owner sets PINs on the users page.</p>}
        <div role="group" aria-label="Your name" className="grid grid-cols-2 gap-2">
          {people.data?.map((p) => (
            <button
              key={p.id}
              type="button"
              onClick={() => {
                setPerson(p)
                setPin('')
                setPinError(null)
              }}
              className="min-h-16 rounded-md border-2 border-stone-300 bg-white px-3 text-xl font-bold hover:bg-stone-50"
            >
              {p.name}
            </button>
          ))}
        </div>
      </div>
    )
  }
  return (
    <form
      className="space-y-4"
      noValidate
      onSubmit={(e) => {
        e.preventDefault()
        const parsed = BenchPinSignInSchema.safeParse({ userId: person.id, pin })
        if (!parsed.success) {
          setPinError(parsed.error.issues[0]?.message ?? 'A PIN is 4 to 6 digits')
          return
        }
        setPinError(null)
        submit(parsed.data)
      }}
    >
      <div className="flex items-center justify-between gap-3">
        <p className="text-xl">
          Signing in as <strong>{person.name}</strong>
        </p>
        <Button variant="secondary" onClick={() => setPerson(null)}>
          Not me
        </Button>
      </div>
      <Field label="Bench PIN" error={pinError ?? undefined}>
        <Input
          type="password"
          inputMode="numeric"
          autoComplete="off"
          autoFocus
          value={pin}
          onChange={(e) => setPin(e.target.value)}
          aria-invalid={!!pinError}
          className="h-14 text-2xl tracking-widest"
        />
      </Field>
      <FormError error={error} />
      <Button type="submit" size="bench" className="w-full" disabled={pending}>
        {pending ? 'Signing in…' : 'Sign in at the bench'}
      </Button>
    </form>
  )
}
