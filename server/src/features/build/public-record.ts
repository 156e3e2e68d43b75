import { jwtVerify, SignJWT } from 'jose'
import type { PublicUnitRecord } from '@kitwright/shared/public-record'
import type { Db } from '../../db/client'
import type { TokenConfig } from '../../lib/auth'
import { NotFound } from '../../lib/http-errors'
import type { Storage } from '../../lib/storage'
import { getShopSettings } from '../settings/settings.service'
import { getUnitRecord } from './unit-record.service'

// A different audience from session tokens, so a record link can never be used to sign in.
const AUDIENCE = 'kitwright:unit-record'

/**
 * The customer's link to a unit's build record: a signed token naming the serial, so nobody can
 * read another unit's record by changing a number in the address. It does not expire: the
 * customer keeps the e-mail.
 */
export async function unitRecordLink(tokens: TokenConfig, publicUrl: string, serial: string): Promise<string> {
  const token = await new SignJWT({}).setProtectedHeader({ alg: 'HS256' }).setSubject(serial).setAudience(AUDIENCE).setIssuedAt().sign(tokens.secret)
  return `${publicUrl.replace(/\/+$/, '')}/record/${token}`
}

export async function readPublicRecord(db: Db, storage: Storage, tokens: TokenConfig, token: string): Promise<PublicUnitRecord> {
  let serial: string
  try {
    const { payload } = await jwtVerify(token, tokens.secret, { algorithms: ['HS256'], audience: AUDIENCE })
    if (!payload.sub) throw new Error('no subject')
    serial = payload.sub
  } catch {
    throw new NotFound('This build-record link is not valid. Copy the whole link from the e-mail, or ask the shop for a new one.')
  }
  const record = await getUnitRecord(db, storage, serial)
  const { shopName } = await getShopSettings(db)
  return {
    serial: record.workOrder.serial,
    shopName,
    kit: { name: record.kit.name },
    revisionCode: record.revision.code,
    steps: record.steps.map((s) => ({ position: s.position, text: s.text, doneAt: s.tick?.at ?? null })),
    lots: record.lots.flatMap((l) => l.fitted.map((f) => ({ sku: l.sku, name: l.name, lotCode: f.lotCode, quantity: f.quantity }))),
    photos: record.photos.map((p) => ({ url: p.url, at: p.at })),
    leakTests: record.leakTests.map((t) => ({ attempt: t.attempt, passed: t.passed, startPressurePa: t.startPressurePa, endPressurePa: t.endPressurePa, holdMinutes: t.holdMinutes, at: t.at })),
  }
}
