import { eq } from 'drizzle-orm'
import type { ShipFromAddress, ShopIdentity, ShopSettings, UpdateShopIdentitySchema, UpdateShopSettings } from '@kitwright/shared/settings'
import type { z } from 'zod'
import type { Db, Tx } from '../../db/client'
import { shopSettings, type ShopSettingsRow } from '../../db/schema/index'
import { recordAudit, type AuditContext } from '../../lib/audit'
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
    nestingTimeLimitSeconds: row.nestingTimeLimitMs / 1000,
    workdayStartHourUtc: row.workdayStartHourUtc,
    workdayHours: row.workdayHours,
    cutMinutesPerUnit: row.cutMinutesPerUnit,
    buildMinutesPerUnit: row.buildMinutesPerUnit,
    packMinutesPerUnit: row.packMinutesPerUnit,
  }
}

async function settingsRow(db: Db | Tx): Promise<ShopSettingsRow> {
  const [row] = await db.select().from(shopSettings).where(eq(shopSettings.id, 1))
  if (!row) throw new NotFound('The shop has no settings yet; run the set-up (npm start) to create them')
  return row
}

export async function getShopSettings(db: Db | Tx): Promise<ShopSettings> {
  return toShopSettings(await settingsRow(db))
}

export async function updateShopSettings(db: Db, input: UpdateShopSettings): Promise<ShopSettings> {
  const { nestingTimeLimitSeconds, ...rest } = input
  const change = nestingTimeLimitSeconds === undefined ? rest : { ...rest, nestingTimeLimitMs: Math.round(nestingTimeLimitSeconds * 1000) }
  const [row] = await db.update(shopSettings).set({ ...change, updatedAt: new Date() }).where(eq(shopSettings.id, 1)).returning()
  if (!row) throw new NotFound('The shop has no settings yet; run the set-up (npm start) to create them')
  return toShopSettings(row)
}

/** What the identity page shows that comes from the environment rather than the database. */
export interface IdentityEnvironment {
  /** PUBLIC_URL. */
  publicUrl: string
  /** MAIL_FROM: the sender address until the owner sets one. */
  mailFrom: string
}

/** The ship-from address of the settings row, or null while any required line is missing. */
export function shipFromOf(row: ShopSettingsRow): ShipFromAddress | null {
  if (!row.senderName || !row.senderLine1 || !row.senderCity || !row.senderPostalCode || !row.senderCountry) return null
  return {
    name: row.senderName,
    line1: row.senderLine1,
    line2: row.senderLine2,
    city: row.senderCity,
    region: row.senderRegion,
    postalCode: row.senderPostalCode,
    country: row.senderCountry,
    phone: row.senderPhone,
  }
}

function toShopIdentity(row: ShopSettingsRow, env: IdentityEnvironment): ShopIdentity {
  return {
    shopName: row.shopName,
    mailFromName: row.mailFromName,
    mailFromAddress: row.mailFromAddress,
    replyToAddress: row.replyToAddress,
    shipFrom: shipFromOf(row),
    carrierName: row.carrierName,
    publicUrl: env.publicUrl,
    mailFromFallback: env.mailFrom,
  }
}

export async function getShopIdentity(db: Db | Tx, env: IdentityEnvironment): Promise<ShopIdentity> {
  return toShopIdentity(await settingsRow(db), env)
}

const IDENTITY_WORDS = {
  shopName: 'shop name',
  mailFromName: 'sender name',
  mailFromAddress: 'sender e-mail',
  replyToAddress: 'reply-to e-mail',
  shipFrom: 'ship-from address',
  carrierName: 'carrier',
} as const

/**
 * Sets the shop's identity as a whole, and writes in the audit trail, in the same transaction, which
 * fields changed with their old and new values.
 */
export async function updateShopIdentity(db: Db, input: z.output<typeof UpdateShopIdentitySchema>, env: IdentityEnvironment, audit: AuditContext): Promise<ShopIdentity> {
  return db.transaction(async (tx) => {
    const before = toShopIdentity(await tx.select().from(shopSettings).where(eq(shopSettings.id, 1)).for('update').then((r) => r[0] ?? missing()), env)
    const a = input.shipFrom
    const [row] = await tx
      .update(shopSettings)
      .set({
        shopName: input.shopName,
        mailFromName: input.mailFromName,
        mailFromAddress: input.mailFromAddress,
        replyToAddress: input.replyToAddress,
        senderName: a?.name ?? null,
        senderLine1: a?.line1 ?? null,
        senderLine2: a?.line2 ?? null,
        senderCity: a?.city ?? null,
        senderRegion: a?.region ?? null,
        senderPostalCode: a?.postalCode ?? null,
        senderCountry: a?.country ?? null,
        senderPhone: a?.phone ?? null,
        ...(input.carrierName !== undefined ? { carrierName: input.carrierName } : {}),
        updatedAt: new Date(),
      })
      .where(eq(shopSettings.id, 1))
      .returning()
    const identity = toShopIdentity(row ?? missing(), env)
    const changed: Record<string, { from: unknown; to: unknown }> = {}
    const words: string[] = []
    for (const key of Object.keys(IDENTITY_WORDS) as (keyof typeof IDENTITY_WORDS)[]) {
      if (JSON.stringify(before[key]) === JSON.stringify(identity[key])) continue
      changed[key] = { from: before[key], to: identity[key] }
      words.push(IDENTITY_WORDS[key])
    }
    if (words.length > 0) {
      await recordAudit(tx, audit, { action: 'settings.identity', entityType: 'settings', summary: `Changed the shop's identity: ${words.join(', ')}`, data: changed })
    }
    return identity
  })
}

function missing(): never {
  throw new NotFound('The shop has no settings yet; run the set-up (npm start) to create them')
}

/** The sender of every customer e-mail: From name and address (the MAIL_FROM fallback until set) and Reply-To. */
export interface MailSender {
  from: { name: string; address: string }
  replyTo: string | null
}

/** Who the next e-mail comes from, read from the settings at the moment it is sent. */
export async function mailSender(db: Db | Tx, fallbackAddress: string): Promise<MailSender> {
  const row = await settingsRow(db)
  return { from: { name: row.mailFromName ?? row.shopName, address: row.mailFromAddress ?? fallbackAddress }, replyTo: row.replyToAddress }
}
