import { eq, inArray, isNull } from 'drizzle-orm'
import { inches } from '@kitwright/shared/domain/units'
import { tables, type Db } from './services'
import { DEMO_PART_SKUS as S } from './catalog'

const { boxes, parts, shopSettings } = tables

/**
 * The demo shop's GS1 Company Prefix: invented for the demo and licensed to nobody. It starts with
 * 952, which (from memory, not checked against GS1's prefix list) GS1 keeps for demonstrations and
 * examples. A real shop enters the prefix its GS1 member organisation licensed to it.
 */
export const DEMO_GS1_COMPANY_PREFIX = '9528100'

/** The demo ship-from address: an invented workshop on an invented street. */
const DEMO_SENDER = {
  senderName: 'Mistwell Tote Works',
  senderLine1: '12 Foundry Lane, Unit 4',
  senderLine2: null,
  senderCity: 'Millbrook Falls',
  senderRegion: 'OR',
  senderPostalCode: '97001',
  senderCountry: 'US',
  senderPhone: '555-0100',
}

/** The demo shop's carrier: the invented carrier of the local stand-in (storage-fake/carrier.ts). A real shop sets its own. */
export const DEMO_CARRIER = 'Brindlepost'

/** The demo shop's e-mail identity: invented addresses on the reserved `.example` domain. */
export const DEMO_MAIL_IDENTITY = {
  mailFromName: 'Mistwell Tote Works',
  mailFromAddress: 'orders@mistwell.example',
  replyToAddress: 'workshop@mistwell.example',
}

/**
 * The demo shop's shipping boxes (outside sizes invented to fit the demo totes) and its ship-from
 * address, e-mail sender and SSCC prefix, when not set yet. Running it twice changes nothing.
 */
export async function seedDemoShipping(db: Db) {
  await db
    .update(shopSettings)
    .set({ ...DEMO_SENDER, gs1CompanyPrefix: DEMO_GS1_COMPANY_PREFIX })
    .where(isNull(shopSettings.senderName))
  await db.update(shopSettings).set(DEMO_MAIL_IDENTITY).where(isNull(shopSettings.mailFromAddress))
  await db.update(shopSettings).set({ carrierName: DEMO_CARRIER }).where(isNull(shopSettings.carrierName))
  const cartons = await db.select({ id: parts.id, sku: parts.sku, weightGrams: parts.weightGrams }).from(parts).where(inArray(parts.sku, [S.cartonLarge, S.cartonSmall]))
  const part = (sku: string) => cartons.find((c) => c.sku === sku)
  const large = part(S.cartonLarge)
  const small = part(S.cartonSmall)
  const rows = [
    ...(large ? [{ code: 'BOX-L', name: 'Large carton (27 gal tote)', partId: large.id, length: inches(31), width: inches(21), height: inches(16), weightGrams: large.weightGrams }] : []),
    ...(small ? [{ code: 'BOX-S', name: 'Small carton (10 gal tote)', partId: small.id, length: inches(25), width: inches(17), height: inches(11), weightGrams: small.weightGrams }] : []),
    { code: 'BOX-M', name: 'Mailer box (spare packs)', partId: null, length: inches(12), width: inches(9), height: inches(4), weightGrams: 180 },
  ]
  for (const row of rows) {
    const [found] = await db.select({ id: boxes.id }).from(boxes).where(eq(boxes.code, row.code))
    if (!found) await db.insert(boxes).values(row)
  }
}
