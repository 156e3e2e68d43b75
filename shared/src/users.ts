import { z } from 'zod'
import { EmailSchema, PasswordSchema, PinSchema } from './auth'
import { RoleSchema } from './roles'

/** A user as the admin's users page shows them. */
export const UserSchema = z.object({
  id: z.string().uuid(),
  email: z.string(),
  name: z.string(),
  role: RoleSchema,
  active: z.boolean(),
  hasPin: z.boolean(),
  createdAt: z.string(),
})
/** A user as the admin's users page shows them. */
export type User = z.infer<typeof UserSchema>

const NameSchema = z.string().trim().min(1, 'Enter a name').max(100, 'Use at most 100 characters')

/** Create a user: a password is required, a bench PIN optional. */
export const CreateUserSchema = z
  .object({
    email: EmailSchema,
    name: NameSchema,
    role: RoleSchema,
    password: PasswordSchema,
    pin: PinSchema.optional(),
  })
  .strict()
/** Create a user: a password is required, a bench PIN optional. */
export type CreateUser = z.infer<typeof CreateUserSchema>

/** Change a user's name, role or active flag. */
export const UpdateUserSchema = z
  .object({ name: NameSchema, role: RoleSchema, active: z.boolean() })
  .partial()
  .strict()
  .refine((v) => Object.keys(v).length > 0, 'Change at least one of name, role or active')
/** Change a user's name, role or active flag. */
export type UpdateUser = z.infer<typeof UpdateUserSchema>

/** Reset a password, a PIN, or both; `pin: null` removes the PIN. */
export const ResetCredentialsSchema = z
  .object({ password: PasswordSchema.optional(), pin: PinSchema.nullable().optional() })
  .strict()
  .refine((v) => v.password !== undefined || v.pin !== undefined, 'Give a new password, a new PIN, or both')
/** Reset a password, a PIN, or both; `pin: null` removes the PIN. */
export type ResetCredentials = z.infer<typeof ResetCredentialsSchema>

/** Path parameter holding a uuid. */
export const IdParamsSchema = z.object({ id: z.string().uuid('Not a valid id') })

/** The health answer. */
export const HealthSchema = z.object({ ok: z.boolean(), db: z.enum(['up', 'down']) })
