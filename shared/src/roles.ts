import { z } from 'zod'

/** The five roles of a Kitwright shop; each bench has its own. */
export const ROLES = ['admin', 'planner', 'cutter', 'assembler', 'packer'] as const

/** A user's role. */
export const RoleSchema = z.enum(ROLES)
/** A user's role. */
export type Role = z.infer<typeof RoleSchema>

/** What each role is called on screen. */
export const ROLE_LABELS: Record<Role, string> = {
  admin: 'Owner (admin)',
  planner: 'Planner',
  cutter: 'Cutter',
  assembler: 'Assembler',
  packer: 'Packer',
}
