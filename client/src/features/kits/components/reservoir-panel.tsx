import { useMemo, useState } from 'react'
import { useFormContext, useWatch } from 'react-hook-form'
import { capacity, depthForVolume, volumeAtDepth, type VolumeUnit } from '@kitwright/shared/domain/reservoir'
import { Button } from '../../../components/ui/button'
import { Field, Input, Select } from '../../../components/ui/field'
import { Section } from '../../../components/ui/section'
import { useLengthUnit } from '../../../lib/shop-settings'
import { errorAt } from './field-error'
import { TOTE_FIELDS, toteFrom, type RevisionFormValues } from './revision-form-model'

/** Water depth for a target volume in this revision's tote, and the volume at a depth (the fill line). */
export function ReservoirPanel({ readOnly }: { readOnly: boolean }) {
  const { register, setValue, formState } = useFormContext<RevisionFormValues>()
  const frame = useWatch<RevisionFormValues, 'frame'>({ name: 'frame' })
  const { parse, format } = useLengthUnit()
  const [volumeUnit, setVolumeUnit] = useState<VolumeUnit>('gal')
  const [volumeText, setVolumeText] = useState('')
  const [depthText, setDepthText] = useState('')
  const tote = useMemo(() => toteFrom(frame, parse), [frame, parse])

  if (!frame.hasTote) {
    return (
      <Section title="Reservoir calculator" id="reservoir">
        <p className="text-stone-600">Enter the tote's inside shape to work out the fill line.</p>
        {!readOnly && (
          <Button variant="secondary" onClick={() => setValue('frame.hasTote', true, { shouldDirty: true })}>
            Enter the tote's shape
          </Button>
        )}
      </Section>
    )
  }
  const shape = tote.value
  const volume = Number(volumeText)
  const depth = depthText ? parse(depthText) : null
  const depthResult = shape && volumeText && Number.isFinite(volume) ? depthForVolume(shape, volume, volumeUnit) : null
  const volumeResult = shape && depth?.ok ? volumeAtDepth(shape, depth.value, volumeUnit) : null
  const round = (n: number) => Math.round(n * 10) / 10
  return (
    <Section title="Reservoir calculator" id="reservoir">
      <div className="grid gap-3 sm:grid-cols-3 lg:grid-cols-5">
        {TOTE_FIELDS.map((f) => (
          <Field key={f.path} label={f.label} error={errorAt(formState.errors, `frame.tote.${f.path}`) ?? tote.errors[`frame.tote.${f.path}`]}>
            <Input {...register(`frame.tote.${f.path}`)} />
          </Field>
        ))}
      </div>
      {shape && (
        <div className="grid gap-3 sm:grid-cols-3" aria-live="polite">
          <p className="self-end">
            Full to the rim: <strong>{round(capacity(shape, volumeUnit))} {volumeUnit === 'gal' ? 'US gal' : 'L'}</strong>
          </p>
          <Field label="Unit">
            <Select value={volumeUnit} onChange={(e) => setVolumeUnit(e.target.value as VolumeUnit)}>
              <option value="gal">US gallons</option>
              <option value="L">litres</option>
            </Select>
          </Field>
          <div />
          <Field label="Water to hold" error={depthResult && !depthResult.ok ? depthResult.message : undefined}>
            <Input inputMode="decimal" value={volumeText} onChange={(e) => setVolumeText(e.target.value)} />
          </Field>
          <p className="self-end">{depthResult?.ok && <>Fill line: <strong>{format(depthResult.depth)}</strong> above the floor</>}</p>
          <div />
          <Field label="Depth of water" error={depth && !depth.ok ? depth.message : volumeResult && !volumeResult.ok ? volumeResult.message : undefined}>
            <Input value={depthText} onChange={(e) => setDepthText(e.target.value)} />
          </Field>
          <p className="self-end">{volumeResult?.ok && <>Holds <strong>{round(volumeResult.volume)} {volumeUnit === 'gal' ? 'US gal' : 'L'}</strong></>}</p>
        </div>
      )}
    </Section>
  )
}
