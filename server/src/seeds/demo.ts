import { z } from 'zod'
import { RoleSchema } from '@kitwright/shared/roles'
import demoUsers from './demo-users.json' with { type: 'json' }
import { eq } from 'drizzle-orm'
import { createBins, hashSecret, tables, type Db } from './services'
import { seedDemoKits } from './kits'
import { seedDemoOrders } from './orders'
import { seedDemoReturn } from './returns'
import { inches } from '@kitwright/shared/domain/units'
import { seedDemoParts } from './catalog'
import { seedDemoStock } from './stock'
import { seedDemoSuppliers } from './suppliers'
import { seedDemoShipping } from './shipping'
import { seedDemoUnitWeights } from './unit-weights'

const { bins, shopSettings, users } = tables

/**
 * The demo shop, Mistwell Tote Works, and its people are invented for the demo; any likeness to a
 * real shop or person is chance. Addresses use the reserved `.example` domain.
 */
export const DEMO_SHOP_NAME = 'Mistwell Tote Works'

/** One demo user per role; start.mjs prints the same file as the demo sign-ins. */
export const DEMO_USERS = z
  .array(z.object({ role: RoleSchema, email: z.string(), name: z.string(), password: z.string(), pin: z.string().optional() }))
  .parse(demoUsers)

/** Loads the demo data; running it twice changes nothing (existing rows are left as they are). */
export async function seedDemo(db: Db) {
  // Kerf of a fine-tooth saw (1/8 in), a 1/4 in squaring cut, offcuts of 6 in or more kept: common practice.
  await db
    .insert(shopSettings)
    .values({ id: 1, shopName: DEMO_SHOP_NAME, displayUnit: 'in', kerf: inches(1 / 8), endTrim: inches(1 / 4), minOffcut: inches(6) })
    .onConflictDoNothing()
  for (const u of DEMO_USERS) {
    await db
      .insert(users)
      .values({
        email: u.email,
        name: u.name,
        role: u.role,
        passwordHash: await hashSecret(u.password),
        pinHash: u.pin ? await hashSecret(u.pin) : null,
      })
      .onConflictDoNothing({ target: users.email })
  }
  await seedDemoParts(db)
  await seedDemoSuppliers(db)
  await seedDemoShipping(db)
  await seedDemoStock(db)
  const [owner] = await db.select().from(users).where(eq(users.email, DEMO_USERS[0]!.email))
  await seedDemoKits(db, { id: owner!.id, email: owner!.email, name: owner!.name, role: owner!.role })
  await seedDemoUnitWeights(db, { id: owner!.id, email: owner!.email, name: owner!.name, role: owner!.role })
  await seedDemoOrders(db, { id: owner!.id, name: owner!.name })
  // One return on its way back, opened by the office (the demo planner).
  const planner = DEMO_USERS.find((u) => u.role === 'planner')
  const [office] = planner ? await db.select().from(users).where(eq(users.email, planner.email)) : [owner!]
  await seedDemoReturn(db, { id: office!.id, email: office!.email, name: office!.name, role: office!.role })
  // A rack of labelled bins, so the cut bench can start at once (a batch of nine units needs nine).
  const [anyBin] = await db.select({ id: bins.id }).from(bins).limit(1)
  if (!anyBin) await createBins(db, { count: DEMO_BIN_COUNT })
}

/** Bins on the demo shop's rack: enough for two batches of nine units and their spare packs. */
export const DEMO_BIN_COUNT = 24
