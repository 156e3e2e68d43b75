/**
 * The usual cautions for the work a kit's build asks for: cutting, drilling, solvent cement, mains
 * power near water, and pressure testing. One place for the words, so the build bench, the kit's
 * default build steps, the frame calculator and the printed sheets say the same thing. Each defers
 * to the maker's instructions, local codes and licensed practice.
 *
 * Sources: these are common practice in the trade. The pressure-test caution is the warning PVC pipe
 * and fitting makers print in their installation instructions (test with water, never with
 * compressed air or gas); the scope of ASTM D2466 (PVC fittings, Schedule 40), section 1.2 and
 * Note 2, says the same: the fittings are meant for pressurised liquids, and compressed air or gas
 * stores enough energy to make a failure dangerous (read in the standard's published scope text).
 */
import type { RevisionContent } from '../kits'

/** Pressure and leak tests: water only. */
export const WATER_ONLY_PRESSURE_TEST_CAUTION =
  'Test with water only — never compressed air or gas: a PVC joint that lets go under air pressure can burst and throw pieces. Stay within the protocol’s test pressure, wear eye protection, and let the pressure off before loosening any fitting.'

/** Cutting pipe on a saw or with a cutter. */
export const CUTTING_CAUTION =
  'Cutting: wear eye protection (PVC chips fly). Clamp the work; never hold a short piece by hand near the blade, and let the blade stop before reaching in. Follow the saw or cutter maker’s instructions.'

/** Drilling and tapping holes in pipe. */
export const DRILLING_CAUTION = 'Drilling: wear eye protection and clamp the pipe or manifold; never hold it by hand near the bit.'

/** Primer and solvent cement. */
export const SOLVENT_CEMENT_CAUTION =
  'Primer and solvent cement: work in a well-ventilated area, with no flames, sparks or smoking nearby (the fumes are flammable). Wear gloves and eye protection as the cement maker’s label directs.'

/** A pump on mains power in a tote of water. */
export const MAINS_NEAR_WATER_CAUTION =
  'Mains power near water: plug the pump only into a ground-fault protected (GFCI/RCD) outlet, keep hands dry, leave a drip loop in the cord, and unplug before reaching into the water. Local electrical codes and a licensed electrician come first.'

/** Every one of the cautions above, in the order the work meets them. */
export const WORK_CAUTIONS: readonly string[] = [
  CUTTING_CAUTION,
  DRILLING_CAUTION,
  SOLVENT_CEMENT_CAUTION,
  MAINS_NEAR_WATER_CAUTION,
  WATER_ONLY_PRESSURE_TEST_CAUTION,
]

type BuildStep = RevisionContent['buildSteps'][number]

const plainStep = (text: string, caution: string): BuildStep => ({
  text,
  caution,
  photoRequired: false,
  measurementRequired: false,
  measurementUnit: null,
  measurementMin: null,
  measurementMax: null,
  freeOrder: false,
  outOfLimitsRework: false,
})

/**
 * The build steps every new kit revision starts with (when it is not copied from another), each
 * carrying its caution. They are ordinary steps: the planner rewords, moves or deletes them per kit.
 */
export function defaultBuildSteps(): BuildStep[] {
  return [
    plainStep('Cut the pipe to the cut list and label each piece.', CUTTING_CAUTION),
    plainStep('Drill (and tap) the sprayer holes at the marked positions, then flush the swarf out of the pipe.', DRILLING_CAUTION),
    plainStep('Prime and cement every joint; let it cure as the cement maker directs.', SOLVENT_CEMENT_CAUTION),
    plainStep('Fit the pump and route its cord out of the tote with a drip loop.', MAINS_NEAR_WATER_CAUTION),
    plainStep('Fill the tote with clean water and fit the test gauge, ready for the leak test (the revision’s protocol).', WATER_ONLY_PRESSURE_TEST_CAUTION),
  ]
}
