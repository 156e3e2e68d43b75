import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { httpCarrier, type ShipmentRequest } from '../../server/src/features/shipping/carrier'
import { startCarrierFake } from '../../storage-fake/carrier'

let fake: Awaited<ReturnType<typeof startCarrierFake>>
beforeAll(async () => {
  fake = await startCarrierFake({ port: 0 })
})
afterAll(() => fake.close())

const address = { name: 'Hollis Marchbank', line1: '9 Lanternwood Close', line2: null, city: 'Ashgrove', region: 'OR', postalCode: '97019', country: 'US' }
const request: ShipmentRequest = {
  from: { ...address, name: 'Mistwell Tote Works', line1: '12 Foundry Lane' },
  to: address,
  parcels: [{ weightGrams: 2_400, lengthMm: 635, widthMm: 432, heightMm: 279 }],
  reference: 'P-TEST',
}

describe('the carrier stand-in, through the carrier adapter', () => {
  it('quotes ground and express, priced per started kilogram', async () => {
    const quotes = await httpCarrier(fake.url).quote(request)
    // The stand-in's invented tariff: ground 8.95 + 0.95 per started kg; 2.4 kg → 3 kg → 8.95 + 2.85 = 11.80.
    expect(quotes).toEqual([
      { service: 'ground', name: 'Ground', days: 5, chargeCents: 1180 },
      { service: 'express', name: 'Express', days: 2, chargeCents: 1995 + 3 * 210 },
    ])
  })

  it('sells labels with distinct tracking numbers and keeps them', async () => {
    const carrier = httpCarrier(fake.url)
    const a = await carrier.buyLabel({ ...request, service: 'ground' })
    const b = await carrier.buyLabel({ ...request, service: 'express' })
    expect(a.trackingNumber).toMatch(/^KWT\d{16}$/)
    expect(b.trackingNumber).not.toBe(a.trackingNumber)
    expect(a).toMatchObject({ service: 'ground', chargeCents: 1180, routingCode: 'US-970' })
    const kept = await fetch(`${fake.url}/v1/labels/${a.trackingNumber}`)
    expect(await kept.json()).toEqual({ service: 'ground', reference: 'P-TEST', parcels: 1 })
  })

  it("passes on the carrier's refusal in words: an unknown service, a parcel over 70 kg", async () => {
    const carrier = httpCarrier(fake.url)
    await expect(carrier.buyLabel({ ...request, service: 'overnight' })).rejects.toThrow('The carrier refused: No service "overnight"; choose ground or express')
    await expect(carrier.quote({ ...request, parcels: [{ ...request.parcels[0]!, weightGrams: 80_000 }] })).rejects.toThrow(/parcels.0.weightGrams: A parcel may weigh at most 70 kg/)
  })

  it('says the carrier cannot be reached when nothing listens', async () => {
    await expect(httpCarrier('http://127.0.0.1:9').quote(request)).rejects.toThrow(/cannot be reached/)
  })
})
