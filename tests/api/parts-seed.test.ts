import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { PartInputSchema } from '@kitwright/shared/parts'
import { inches } from '@kitwright/shared/domain/units'
import { parts } from '../../server/src/db/schema/index'
import { DEMO_PART_SKUS, seedDemoParts } from '../../server/src/seeds/catalog'
import { createTestDb, type TestDb } from '../support/test-db'

let t: TestDb
beforeAll(async () => {
  t = await createTestDb()
})
afterAll(() => t.drop())

describe('demo catalog parts', () => {
  it('seeds every SKU the kits refer to, once, however often it runs', async () => {
    await seedDemoParts(t.db)
    await seedDemoParts(t.db)
    const rows = await t.db.select().from(parts)
    expect(rows.map((r) => r.sku).sort()).toEqual(Object.values(DEMO_PART_SKUS).sort())
    for (const row of rows) {
      // The link to a supplier record is set on the Suppliers page, not through the part's input.
      const { id: _id, active: _a, createdAt: _c, updatedAt: _u, supplierId: _s, ...input } = row
      expect(() => PartInputSchema.parse(input)).not.toThrow()
    }
  })

  it('holds 1/2 in Schedule 40 pipe with its 0.840 in outside diameter in 10 ft and 20 ft sticks', async () => {
    await seedDemoParts(t.db)
    const pipe = (await t.db.select().from(parts)).find((r) => r.sku === DEMO_PART_SKUS.pipeHalfInch)!
    // ASTM D1785: 1/2 in nominal Schedule 40 PVC has an outside diameter of 0.840 in.
    expect(pipe.outsideDiameter).toBe(inches(0.84))
    expect(pipe.stickLengths).toEqual([inches(120), inches(240)])
    expect(pipe.kind).toBe('stock_length')
  })
})
