import { ROLES } from '@kitwright/shared/roles'
import type { Access, RouteRecord } from '../../server/src/lib/routes'
import { CALLERS, type Caller, type ExpectedAccess } from './access-expected'

/** Who a route table rule lets through, caller by caller. */
export function callersLetThrough(access: Access): Set<Caller> {
  if (access === 'public') return new Set(CALLERS)
  if (access === 'signed-in') return new Set(ROLES)
  return new Set(access)
}

/**
 * Every difference between the route table and the hand-written grid: a route the grid does not
 * know, a route the grid names that the table lacks, and each caller a rule lets through or refuses
 * against the grid's answer. Empty when they agree.
 */
export function accessDifferences(records: readonly Pick<RouteRecord, 'method' | 'path' | 'access'>[], expected: ExpectedAccess): string[] {
  const out: string[] = []
  const seen = new Set<string>()
  for (const r of records) {
    const key = `${r.method} ${r.path}`
    seen.add(key)
    const want = expected.get(key)
    if (!want) {
      out.push(`${key}: not in tests/api/access-expected.ts (decide who should call it and add a line)`)
      continue
    }
    const got = callersLetThrough(r.access)
    for (const caller of CALLERS) {
      if (got.has(caller) && !want.has(caller)) out.push(`${key}: the route table lets ${caller} through; the shop expects a refusal`)
      if (!got.has(caller) && want.has(caller)) out.push(`${key}: the route table refuses ${caller}; the shop expects it let through`)
    }
  }
  for (const key of expected.keys()) if (!seen.has(key)) out.push(`${key}: in tests/api/access-expected.ts but not in the route table`)
  return out
}

/**
 * The same rule with one caller's answer turned over, or null where the rule language cannot say it
 * (a public route refusing one role, a role list left empty).
 */
export function withOneCallerTurned(access: Access, caller: Caller): Access | null {
  const who = callersLetThrough(access)
  if (who.has(caller)) who.delete(caller)
  else who.add(caller)
  if (who.has('signed-out')) return ROLES.every((r) => who.has(r)) ? 'public' : null
  const roles = ROLES.filter((r) => who.has(r))
  return roles.length === 0 ? null : roles
}
