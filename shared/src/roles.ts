import { z } from 'zod'

/** The five roles of a Kitwright shop; each bench has its own. */
export const ROLES = ['admin', 'planner', 'cutter', 'assembler', 'packer'] as const

/** A user's role. */
export const RoleSchema = z.enum(ROLES)
/** A user's role. */
export type Role = z.infer<typeof RoleSchema>

/** The roles that see what the shop pays (part unit costs, a kit's cost roll-up): the office's business, not the benches'. */
export const COST_ROLES = ['admin', 'planner'] as const satisfies readonly Role[]
/** Whether a role sees part costs; the API blanks them (null) for everyone else. */
export const seesCosts = (role: Role): boolean => (COST_ROLES as readonly Role[]).includes(role)

/** What each role is called on screen. */
export const ROLE_LABELS: Record<Role, string> = {
  admin: 'Owner (admin)',
  planner: 'Planner',
  cutter: 'Cutter',
  assembler: 'Assembler',
  packer: 'Packer',
}
