import { eq } from 'drizzle-orm'
import type { ShopSettings, UpdateShopSettings } from '@kitwright/shared/settings'
import type { Db, Tx } from '../../db/client'
import { shopSettings, type ShopSettingsRow } from '../../db/schema/index'
import { NotFound } from '../../lib/http-errors'

function toShopSettings(row: ShopSettingsRow): ShopSettings {
  return {
    shopName: row.shopName,
    displayUnit: row.displayUnit,
    kerf: row.kerf,
    endTrim: row.endTrim,
    minOffcut: row.minOffcut,
    leadTimeDays: row.leadTimeDays,
    autoReleasePaid: row.autoReleasePaid,
  }
}

export async function getShopSettings(db: Db | Tx): Promise<ShopSettings> {
  const [row] = await db.select().from(shopSettings).where(eq(shopSettings.id, 1))
  if (!row) throw new NotFound('The shop has no settings yet; run the set-up (npm start) to create them')
  return toShopSettings(row)
}

export async function updateShopSettings(db: Db, input: UpdateShopSettings): Promise<ShopSettings> {
  const [row] = await db.update(shopSettings).set({ ...input, updatedAt: new Date() }).where(eq(shopSettings.id, 1)).returning()
  if (!row) throw new NotFound('The shop has no settings yet; run the set-up (npm start) to create them')
  return toShopSettings(row)
}
