import { WATER_ONLY_PRESSURE_TEST_CAUTION } from '@kitwright/shared/domain/safety-cautions'
import { Caution } from '../../../components/ui/section'

/** The cautions for running a mains-powered pump in water and holding the manifold under pressure. */
export function WaterPowerCautions() {
  return (
    <div className="space-y-2" aria-label="Water, mains power and pressure cautions" role="group">
      <Caution>
        <strong>Water and mains power together.</strong> Plug the pump only into a ground-fault protected outlet (GFCI/RCD). Keep your hands dry when
        you touch the plug. Leave a drip loop in the pump cord so water runs off below the outlet. Unplug the pump before you reach into the water.
      </Caution>
      <Caution>
        <strong>Pressure.</strong> {WATER_ONLY_PRESSURE_TEST_CAUTION}
      </Caution>
      <p className="text-base text-stone-700">Local electrical codes and licensed practice come first; where they ask for more, do what they ask.</p>
    </div>
  )
}
