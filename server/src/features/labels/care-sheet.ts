/**
 * The customer's care and safety sheet printed with the packing slip. A pump runs on mains power
 * in water: when the box holds a part marked electrical, the electrical cautions are printed, and
 * they defer to local codes and licensed practice. A box with no electrical part gets none of them.
 */
export const ELECTRICAL_CAUTIONS = [
  'Plug the pump only into a ground-fault protected outlet (GFCI / RCD). If you are not sure an outlet is protected, have a licensed electrician check it.',
  'Leave a drip loop in the cord: let it hang below the outlet before it rises to the plug, so water running down the cord drips off instead of reaching the socket.',
  'Unplug the pump before reaching into the water, before moving the tote, and before any cleaning.',
  'Keep the cord and the plug dry; never use an extension cord lying on a wet floor. Do not use a pump with a damaged cord.',
  'Keep children and pets away from the reservoir and the cord.',
]

export const CARE_NOTES = [
  'Fill with clean water to the fill line above, never higher: the pump must stay covered, and the manifold must stay above the water.',
  'Check the water level every few days; top up to the fill line.',
  'Change the nutrient solution as its maker directs, and rinse the sprayers if the mist weakens.',
]

export const LOCAL_CODES =
  'These notes do not replace local electrical codes, the pump maker’s instructions, or the advice of a licensed electrician: where they differ, those come first.'

/** Whether the care sheet of a box carries the electrical cautions: only when the box holds a part that runs on mains power. */
export function needsElectricalCautions(partsInBox: readonly { electrical: boolean }[]): boolean {
  return partsInBox.some((p) => p.electrical)
}
