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
/** Sign in at a bench with e-mail and PIN. */
export const PinSignInSchema = z.object({ email: EmailSchema, pin: PinSchema }).strict()

/** Sign in with a password, or at a bench with a PIN. */
export const SignInSchema = z.union([PasswordSignInSchema, PinSignInSchema])
/** Sign in with a password, or at a bench with a PIN. */
export type SignIn = z.infer<typeof SignInSchema>

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
