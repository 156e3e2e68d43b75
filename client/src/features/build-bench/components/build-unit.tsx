import type { BuildPage } from '@kitwright/shared/build'
import { Section } from '../../../components/ui/section'
import { BuildSummary } from './build-summary'
import { LeakTestForm } from './leak-test-form'
import { LeakTestList } from './leak-test-list'
import { LotPrompt } from './lot-prompt'
import { PhotoButton } from './photo-button'
import { PhotoStrip } from './photo-strip'
import { StepCard } from './step-card'
import { WaterPowerCautions } from './water-power-cautions'

/** The build bench for one scanned unit: its steps, photos, leak test and rework. */
export function BuildUnit({ code, page }: { code: string; page: BuildPage }) {
  const built = page.workOrder.status === 'built'
  const unitPhotos = page.photos.filter((p) => p.stepId === null)
  return (
    <div className="space-y-6">
      <BuildSummary page={page} />
      {page.lots.length > 0 && (
        <Section title="Lots of the parts fitted" id="build-lots">
          <LotPrompt code={code} page={page} />
        </Section>
      )}
      <Section title="Steps" id="build-steps">
        <ol className="space-y-4">
          {page.steps.map((step) => (
            <StepCard key={step.id} code={code} page={page} step={step} />
          ))}
        </ol>
      </Section>
      <Section title="Leak test" id="build-leak-test">
        {page.leakTestProtocol ? (
          <div className="space-y-4">
            <WaterPowerCautions />
            <LeakTestList tests={page.leakTests} />
            {!built && <LeakTestForm key={page.leakTests.length} code={code} page={page} />}
          </div>
        ) : (
          <p className="text-lg">This revision has no leak test: it is done when every step is ticked.</p>
        )}
      </Section>
      <Section title="More photos of the unit" id="build-photos">
        <PhotoStrip photos={unitPhotos} />
        {!built && <PhotoButton code={code} workOrderId={page.workOrder.id} stepId={null} label="Photo of the unit" />}
      </Section>
    </div>
  )
}
