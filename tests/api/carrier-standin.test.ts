import { randomUUID } from 'node:crypto'
import { mkdtempSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import path from 'node:path'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { ShipmentRequest } from '../../server/src/features/shipping/carrier'
import { easyPostCarrier } from '../../server/src/features/shipping/easypost-carrier'
import { signCarrierEvent, startCarrierFake, STANDIN_CARRIER, trackingEventBody } from '../../storage-fake/carrier'

const SECRET = 'carrier-standin-test-secret-0123'
const dir = mkdtempSync(path.join(tmpdir(), 'kitwright-carrier-'))
let fake: Awaited<ReturnType<typeof startCarrierFake>>
const carrierAt = (url: string) => easyPostCarrier({ apiKey: 'test-key', baseUrl: url, webhookSecret: SECRET })
beforeAll(async () => {
  fake = await startCarrierFake({ port: 0, directory: dir })
})
afterAll(async () => {
  await fake.close()
  rmSync(dir, { recursive: true, force: true })
})

const address = { name: 'Hollis Marchbank', line1: '9 Lanternwood Close', line2: null, city: 'Ashgrove', region: 'OR', postalCode: '97019', country: 'US' }
const request: ShipmentRequest = {
  from: { ...address, name: 'Mistwell Tote Works', line1: '12 Foundry Lane' },
  to: address,
  parcels: [
    { weightGrams: 2_400, lengthMm: 635, widthMm: 432, heightMm: 279 },
    { weightGrams: 900, lengthMm: 305, widthMm: 229, heightMm: 102 },
  ],
  reference: 'P-TEST',
}
const ground = { carrier: STANDIN_CARRIER, service: 'ground' }

describe('the carrier stand-in, through the shipping API SDK and the carrier adapter', () => {
  it('quotes every service for all parcels together, priced per started pound (1 lb = 453.59237 g, 1 oz = 28.349523125 g)', async () => {
    const quotes = await carrierAt(fake.url).quote(request)
    expect(quotes.map((q) => [q.carrier, q.service])).toEqual([[STANDIN_CARRIER, 'ground'], [STANDIN_CARRIER, 'express']])
    // 2400 g = 84.66 oz → 84.7 oz sent → 6 started pounds; 900 g = 31.75 oz → 31.8 oz → 2 started pounds.
    expect(quotes[0]!.chargeCents).toBe(895 + 6 * 45 + 895 + 2 * 45)
  })

  it('checks the address: a US ZIP code of the wrong shape is refused in words', async () => {
    const carrier = carrierAt(fake.url)
    await expect(carrier.checkAddress(address)).resolves.toEqual({ ok: true })
    const bad = await carrier.checkAddress({ ...address, postalCode: '970' })
    expect(bad.ok).toBe(false)
    expect(bad.ok ? '' : bad.message).toMatch(/Unable to verify address.*ZIP codes are 5 digits/)
  })

  it('buys once per key: the same key gives the same purchase and the same label, one tracking number per parcel', async () => {
    const carrier = carrierAt(fake.url)
    const key = randomUUID()
    const ref = await carrier.prepareLabel(request, key)
    expect(await carrier.prepareLabel(request, key)).toBe(ref)
    expect(await carrier.findLabel(ref)).toBeNull()
    const label = await carrier.buyLabel(ref, ground, key)
    expect(label.parcels).toHaveLength(2)
    expect(new Set(label.parcels.map((p) => p.trackingNumber)).size).toBe(2)
    expect(await carrier.buyLabel(ref, ground, key)).toEqual(label)
    // Another key on the same purchase is not a second label: the adapter finds the one sold.
    expect(await carrier.buyLabel(ref, ground, randomUUID())).toEqual(label)
    expect(await carrier.findLabel(ref)).toEqual(label)
  })

  it('hands out tracking numbers never seen before after a restart, and still knows a purchase made before it', async () => {
    const carrier = carrierAt(fake.url)
    const key = randomUUID()
    const ref = await carrier.prepareLabel(request, key)
    const before = await carrier.buyLabel(ref, ground, key)
    await fake.close()
    fake = await startCarrierFake({ port: 0, directory: dir })
    const again = carrierAt(fake.url)
    expect(await again.findLabel(ref)).toEqual(before)
    const k2 = randomUUID()
    const after = await again.buyLabel(await again.prepareLabel(request, k2), ground, k2)
    const numbers = [...before.parcels, ...after.parcels].map((p) => p.trackingNumber)
    expect(new Set(numbers).size).toBe(numbers.length)
  })

  it("passes on the carrier's refusal in words, and says when it cannot be reached", async () => {
    const carrier = carrierAt(fake.url)
    const key = randomUUID()
    const ref = await carrier.prepareLabel(request, key)
    await expect(carrier.buyLabel(
      ref,
      { carrier: STANDIN_CARRIER, service: 'overnight' },
      key,
    )).rejects.toMatchObject({ status: 409, message: expect.stringMatching(/The carrier refused the label: No service "overnight"/) })
    await expect(carrier.quote({ ...request, parcels: [{ ...request.parcels[0]!, weightGrams: 80_000 }] })).rejects.toMatchObject({ status: 409, message: expect.stringMatching(/70 kg/) })
    await expect(carrierAt('http://127.0.0.1:9/v2/').quote(request)).rejects.toMatchObject({ status: 503, message: expect.stringMatching(/could not be reached/) })
  })

  it('refunds every parcel of a label, and reads the tracking status', async () => {
    const carrier = carrierAt(fake.url)
    const key = randomUUID()
    const label = await carrier.buyLabel(await carrier.prepareLabel(request, key), ground, key)
    await expect(carrier.trackingStatus(label.parcels[0]!.trackingNumber, STANDIN_CARRIER)).resolves.toMatchObject({ status: 'pre_transit' })
    fake.advance(label.parcels[0]!.trackingNumber, 'in_transit', 'Departed the sorting hub')
    await expect(carrier.trackingStatus(label.parcels[0]!.trackingNumber, STANDIN_CARRIER)).resolves.toMatchObject({ status: 'in_transit', detail: 'Departed the sorting hub' })
    await expect(carrier.voidLabel(label.parcels.map((p) => p.carrierParcelRef))).resolves.toBe('submitted')
  })

  it('reads a signed tracking event through the SDK, and refuses one with a wrong signature', () => {
    const carrier = carrierAt(fake.url)
    const body = trackingEventBody({ eventId: 'evt_1', trackingCode: 'BP000000001', status: 'delivered' })
    expect(carrier.readEvent(Buffer.from(body), { 'x-hmac-signature': signCarrierEvent(SECRET, body) })).toMatchObject({ eventId: 'evt_1', trackingNumber: 'BP000000001', status: 'delivered' })
    expect(() => carrier.readEvent(Buffer.from(body), { 'x-hmac-signature': signCarrierEvent('another-secret-entirely', body) })).toThrow(/signature/i)
    expect(() => carrier.readEvent(Buffer.from(body), {})).toThrow()
  })
})
