import { z } from 'zod'
import { RoleSchema } from './roles'

/** A bench PIN: 4 to 6 digits. */
export const PinSchema = z.string().regex(/^\d{4,6}$/, 'A PIN is 4 to 6 digits')

/** Passwords: long enough to resist guessing, short enough for bcrypt (72 bytes). */
export const PasswordSchema = z
  .string()
  .min(10, 'Use at least 10 characters')
  .max(72, 'Use at most 72 characters')

const EmailSchema = z.string().trim().toLowerCase().email('Enter an e-mail address such as name@shop.example')

/** Sign in with e-mail and password. */
export const PasswordSignInSchema = z.object({ email: EmailSchema, password: z.string().min(1, 'Enter your password') }).strict()
/** Sign in at a bench with e-mail and PIN (a bench PC with a keyboard). */
export const PinSignInSchema = z.object({ email: EmailSchema, pin: PinSchema }).strict()
/** Sign in at a bench tablet: the name picked from the bench's list, and the PIN. No e-mail. */
export const BenchPinSignInSchema = z.object({ userId: z.string().uuid('Pick your name from the list'), pin: PinSchema }).strict()

/** Sign in with a password, or at a bench with a PIN (by name or by e-mail). */
export const SignInSchema = z.union([PasswordSignInSchema, PinSignInSchema, BenchPinSignInSchema])
/** Sign in with a password, or at a bench with a PIN. */
export type SignIn = z.infer<typeof SignInSchema>

/** The benches a tablet can stand at. */
export const BENCH_DEVICES = ['cut', 'build', 'pack'] as const
/** A bench a tablet stands at. */
export type BenchDevice = (typeof BENCH_DEVICES)[number]

/** `GET /api/auth/bench-people?bench=`: which bench's people to list (omitted: every bench role). */
export const BenchPeopleQuerySchema = z.object({ bench: z.enum(BENCH_DEVICES, { error: 'Choose the cut, build or pack bench' }).optional() })
/** One name on a bench's sign-in screen: the display name and the id to sign in with, nothing else. */
export const BenchPersonSchema = z.object({ id: z.string().uuid(), name: z.string() })
/** One name on a bench's sign-in screen. */
export type BenchPerson = z.infer<typeof BenchPersonSchema>

/** The signed-in user as the API shows them. */
export const MeSchema = z.object({
  id: z.string().uuid(),
  email: z.string(),
  name: z.string(),
  role: RoleSchema,
})
/** The signed-in user as the API shows them. */
export type Me = z.infer<typeof MeSchema>

/**
 * `GET /api/auth/me`: who is signed in, `null` when nobody is. Always a 200, so a browser opening
 * the app before signing in logs no failed request.
 */
export const SessionSchema = z.object({ user: MeSchema.nullable() })
/** Who is signed in, if anyone. */
export type Session = z.infer<typeof SessionSchema>

export { EmailSchema }
