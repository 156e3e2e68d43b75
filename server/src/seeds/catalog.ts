import { and, eq, isNull } from 'drizzle-orm'
import { PartInputSchema, type PartInputDraft } from '@kitwright/shared/parts'
import { inches } from '@kitwright/shared/domain/units'
import { tables, type Db } from './services'

const { parts } = tables

/** The demo parts' SKUs, for the kits seed and tests to refer to. Scheme: FAMILY-WHAT-SIZE. */
export const DEMO_PART_SKUS = {
  pipeHalfInch: 'PVC-050-S40',
  elbowHalfInch: 'FIT-ELB-050',
  teeHalfInch: 'FIT-TEE-050',
  pumpAdapter: 'FIT-ADP-050-FPT',
  sprayer: 'SPR-360-THR',
  netCup: 'CUP-NET-2IN',
  collar: 'CLR-FOAM-2IN',
  drainFitting: 'DRN-FIT-075',
  grommet: 'DRN-GRM-075',
  pump: 'PMP-400-GPH',
  tote27A: 'TOTE-27-A',
  tote27B: 'TOTE-27-B',
  tote10: 'TOTE-10-A',
  tubing: 'TUB-VNL-050',
  cartonLarge: 'PKG-CTN-L',
  cartonSmall: 'PKG-CTN-S',
  hardwareBag: 'PKG-BAG-HW',
  kraftPaper: 'PKG-KRAFT',
  primer: 'CHM-PRM-8OZ',
  cement: 'CHM-CMT-8OZ',
} as const

// Invented suppliers of the demo shop; any likeness to a real company is chance.
const PIPE_YARD = 'Ridgeback Pipe & Fitting Supply'
const IRRIGATION = 'Fernhollow Irrigation Parts'
const PUMPS = 'Brightwater Pumpworks'
const TOTES = 'Cobblestone Bin & Tote'
const PACKAGING = 'Tallgrass Packaging Co.'

const S = DEMO_PART_SKUS
const hardware = { kind: 'hardware', unitOfMeasure: 'each' } as const
const packaging = { kind: 'packaging', unitOfMeasure: 'each' } as const

/**
 * The demo catalog's parts. Costs, weights, lead times and stock levels are invented demo values,
 * in the range a small shop might pay; they are not quotes from anyone.
 * Pipe: cost and weight are per 10 ft stick (the shorter stick it is bought in); a 20 ft stick is
 * twice both. 1/2 in Schedule 40 PVC weighs about 0.16 lb/ft (from memory), so ≈ 730 g per 10 ft.
 */
export const DEMO_PARTS: PartInputDraft[] = [
  {
    sku: S.pipeHalfInch,
    name: '1/2 in Schedule 40 PVC pipe, plain end',
    kind: 'stock_length',
    unitOfMeasure: 'stick',
    unitCostCents: 348,
    weightGrams: 730,
    supplier: PIPE_YARD,
    leadTimeDays: 3,
    reorderPoint: 20,
    reorderQuantity: 50,
    shelfLocation: 'RACK-P1',
    nominalSize: '1/2',
    // ASTM D1785: 1/2 in nominal Schedule 40 has an outside diameter of 0.840 in.
    outsideDiameter: inches(0.84),
    stickLengths: [inches(120), inches(240)],
  },
  {
    ...hardware,
    sku: S.elbowHalfInch,
    name: '1/2 in 90° elbow, slip × slip',
    unitCostCents: 42,
    weightGrams: 11,
    supplier: PIPE_YARD,
    leadTimeDays: 3,
    reorderPoint: 100,
    reorderQuantity: 250,
    shelfLocation: 'A1-01',
  },
  {
    ...hardware,
    sku: S.teeHalfInch,
    name: '1/2 in tee, slip × slip × slip',
    unitCostCents: 48,
    weightGrams: 14,
    supplier: PIPE_YARD,
    leadTimeDays: 3,
    reorderPoint: 100,
    reorderQuantity: 250,
    shelfLocation: 'A1-02',
  },
  {
    ...hardware,
    sku: S.pumpAdapter,
    name: '1/2 in pump adapter, slip × female thread',
    unitCostCents: 89,
    weightGrams: 12,
    supplier: PIPE_YARD,
    leadTimeDays: 3,
    reorderPoint: 25,
    reorderQuantity: 50,
    shelfLocation: 'A1-03',
  },
  {
    ...hardware,
    sku: S.sprayer,
    name: '360° misting sprayer, threaded',
    unitCostCents: 65,
    weightGrams: 4,
    supplier: IRRIGATION,
    leadTimeDays: 14,
    reorderPoint: 200,
    reorderQuantity: 500,
    shelfLocation: 'A2-01',
    lotTracked: true,
  },
  {
    ...hardware,
    sku: S.netCup,
    name: '2 in net cup',
    unitCostCents: 12,
    weightGrams: 6,
    supplier: IRRIGATION,
    leadTimeDays: 14,
    reorderPoint: 300,
    reorderQuantity: 1000,
    shelfLocation: 'A2-02',
  },
  {
    ...hardware,
    sku: S.collar,
    name: '2 in foam collar',
    unitCostCents: 15,
    weightGrams: 3,
    supplier: IRRIGATION,
    leadTimeDays: 14,
    reorderPoint: 300,
    reorderQuantity: 1000,
    shelfLocation: 'A2-03',
  },
  {
    ...hardware,
    sku: S.drainFitting,
    name: '3/4 in bulkhead drain fitting with cap',
    unitCostCents: 240,
    weightGrams: 28,
    supplier: IRRIGATION,
    leadTimeDays: 14,
    reorderPoint: 25,
    reorderQuantity: 60,
    shelfLocation: 'A2-04',
  },
  {
    ...hardware,
    sku: S.grommet,
    name: '3/4 in rubber grommet for drain',
    unitCostCents: 55,
    weightGrams: 5,
    supplier: IRRIGATION,
    leadTimeDays: 14,
    reorderPoint: 25,
    reorderQuantity: 60,
    shelfLocation: 'A2-05',
  },
  {
    ...hardware,
    sku: S.pump,
    name: 'Submersible pump, about 400 gal/h, mains powered',
    unitCostCents: 2450,
    weightGrams: 1200,
    electrical: true,
    lotTracked: true,
    supplier: PUMPS,
    leadTimeDays: 21,
    reorderPoint: 10,
    reorderQuantity: 24,
    shelfLocation: 'B1-01',
  },
  {
    ...hardware,
    sku: S.tote27A,
    name: '27 gal storage tote with lid (12-site kit)',
    unitCostCents: 1480,
    weightGrams: 2700,
    supplier: TOTES,
    leadTimeDays: 10,
    reorderPoint: 8,
    reorderQuantity: 20,
    shelfLocation: 'FLOOR-T1',
  },
  {
    ...hardware,
    sku: S.tote27B,
    name: '27 gal storage tote with lid, wider (rev B)',
    unitCostCents: 1620,
    weightGrams: 2900,
    supplier: TOTES,
    leadTimeDays: 10,
    reorderPoint: 8,
    reorderQuantity: 20,
    shelfLocation: 'FLOOR-T2',
  },
  {
    ...hardware,
    sku: S.tote10,
    name: '10 gal compact tote with lid (6-site kit)',
    unitCostCents: 890,
    weightGrams: 1300,
    supplier: TOTES,
    leadTimeDays: 10,
    reorderPoint: 6,
    reorderQuantity: 20,
    shelfLocation: 'FLOOR-T3',
  },
  {
    ...hardware,
    sku: S.tubing,
    name: '1/2 in ID clear vinyl tubing',
    unitOfMeasure: 'ft',
    unitCostCents: 45,
    weightGrams: 45,
    supplier: IRRIGATION,
    leadTimeDays: 14,
    reorderPoint: 50,
    reorderQuantity: 100,
    shelfLocation: 'A3-01',
  },
  {
    ...hardware,
    sku: S.primer,
    name: 'PVC primer, 8 fl oz can',
    unitCostCents: 690,
    weightGrams: 280,
    supplier: PIPE_YARD,
    leadTimeDays: 3,
    reorderPoint: 2,
    reorderQuantity: 6,
    shelfLocation: 'CAB-1',
  },
  {
    ...hardware,
    sku: S.cement,
    name: 'PVC solvent cement, 8 fl oz can',
    unitCostCents: 740,
    weightGrams: 300,
    supplier: PIPE_YARD,
    leadTimeDays: 3,
    reorderPoint: 2,
    reorderQuantity: 6,
    shelfLocation: 'CAB-1',
  },
  {
    ...packaging,
    sku: S.cartonLarge,
    name: 'Shipping carton, large (fits the 27 gal tote)',
    unitCostCents: 420,
    weightGrams: 1600,
    supplier: PACKAGING,
    leadTimeDays: 7,
    reorderPoint: 15,
    reorderQuantity: 50,
    shelfLocation: 'PK-01',
  },
  {
    ...packaging,
    sku: S.cartonSmall,
    name: 'Shipping carton, small (10 gal tote, spare packs)',
    unitCostCents: 210,
    weightGrams: 700,
    supplier: PACKAGING,
    leadTimeDays: 7,
    reorderPoint: 15,
    reorderQuantity: 50,
    shelfLocation: 'PK-02',
  },
  {
    ...packaging,
    sku: S.kraftPaper,
    name: 'Kraft void-fill paper',
    unitOfMeasure: 'ft',
    unitCostCents: 5,
    weightGrams: 18,
    supplier: PACKAGING,
    leadTimeDays: 7,
    reorderPoint: 300,
    reorderQuantity: 1000,
    shelfLocation: 'PK-03',
  },
  {
    ...packaging,
    sku: S.hardwareBag,
    name: 'Zip hardware bag, 6 × 9 in',
    unitCostCents: 6,
    weightGrams: 3,
    supplier: PACKAGING,
    leadTimeDays: 7,
    reorderPoint: 200,
    reorderQuantity: 500,
    shelfLocation: 'PK-04',
  },
]

/**
 * Customs facts of the demo parts: HS subheadings that are common classifications for such goods,
 * chosen for the demo; a shop must check its own with its customs broker or the tariff of the
 * country of import; they are not advice. Countries of origin are the invented scenario's.
 * Packaging (cartons, bags, paper) is not declared.
 */
export const DEMO_PART_CUSTOMS: Partial<Record<keyof typeof S, { hsCode: string; originCountry: string; customsDescription: string }>> = {
  pipeHalfInch: { hsCode: '391723', originCountry: 'US', customsDescription: 'Rigid PVC pipe, cut to length' },
  elbowHalfInch: { hsCode: '391740', originCountry: 'US', customsDescription: 'PVC pipe fitting (elbow)' },
  teeHalfInch: { hsCode: '391740', originCountry: 'US', customsDescription: 'PVC pipe fitting (tee)' },
  pumpAdapter: { hsCode: '391740', originCountry: 'US', customsDescription: 'PVC pipe fitting (threaded adapter)' },
  sprayer: { hsCode: '842490', originCountry: 'CN', customsDescription: 'Plastic misting nozzle for a spray manifold' },
  netCup: { hsCode: '392690', originCountry: 'CN', customsDescription: 'Plastic net cup for plants' },
  collar: { hsCode: '392690', originCountry: 'CN', customsDescription: 'Plastic foam plant collar' },
  drainFitting: { hsCode: '391740', originCountry: 'CN', customsDescription: 'Plastic bulkhead drain fitting with cap' },
  grommet: { hsCode: '401699', originCountry: 'CN', customsDescription: 'Rubber grommet' },
  pump: { hsCode: '841370', originCountry: 'CN', customsDescription: 'Submersible electric water pump' },
  tote27A: { hsCode: '392310', originCountry: 'US', customsDescription: 'Plastic storage tote with lid' },
  tote27B: { hsCode: '392310', originCountry: 'US', customsDescription: 'Plastic storage tote with lid' },
  tote10: { hsCode: '392310', originCountry: 'US', customsDescription: 'Plastic storage tote with lid' },
  tubing: { hsCode: '391732', originCountry: 'US', customsDescription: 'Flexible PVC tubing' },
  primer: { hsCode: '381400', originCountry: 'US', customsDescription: 'PVC primer (solvent)' },
  cement: { hsCode: '350691', originCountry: 'US', customsDescription: 'PVC solvent cement (adhesive)' },
}

/** Adds the demo parts; a SKU already present is left as it is, so running it twice changes nothing. */
export async function seedDemoParts(db: Db) {
  // Parse through the same contract as the API so the demo never holds a part the forms would refuse.
  const rows = DEMO_PARTS.map((p) => {
    const key = (Object.keys(S) as (keyof typeof S)[]).find((k) => S[k] === p.sku)
    return PartInputSchema.parse({ ...p, ...(key ? DEMO_PART_CUSTOMS[key] : {}) })
  })
  await db.insert(parts).values(rows).onConflictDoNothing({ target: parts.sku })
  // A demo database seeded before parts had customs facts gets them; facts a shop set are kept.
  for (const r of rows) {
    if (r.hsCode)
      await db
        .update(parts)
        .set({ hsCode: r.hsCode, originCountry: r.originCountry, customsDescription: r.customsDescription })
        .where(and(eq(parts.sku, r.sku), isNull(parts.hsCode), isNull(parts.originCountry)))
  }
}
