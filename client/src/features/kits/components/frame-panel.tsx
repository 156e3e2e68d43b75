import { useMemo } from 'react'
import { useFormContext, useWatch } from 'react-hook-form'
import { computeFrame, type FrameResult } from '@kitwright/shared/domain/frame'
import type { Part } from '@kitwright/shared/parts'
import { Button } from '../../../components/ui/button'
import { Field, Input, Select } from '../../../components/ui/field'
import { Caution, Section } from '../../../components/ui/section'
import { useLengthUnit } from '../../../lib/shop-settings'
import { errorAt } from './field-error'
import { FRAME_COUNT_FIELDS, FRAME_LENGTH_FIELDS, fieldKey, frameInputsFrom, type RevisionFormValues } from './revision-form-model'

type CutPartValues = RevisionFormValues['cutParts']
type Format = (v: number) => string

/**
 * The revision's cut parts with the calculated cut list in place of the old calculated lines: a
 * line keeps its override when the planner gave a reason and the new length still differs; lines
 * entered by hand stay after the calculated ones.
 */
export function mergeCutList(current: CutPartValues, cutList: FrameResult['cutList'], pipePartId: string, formatInput: Format): CutPartValues {
  const byKey = new Map(current.filter((c) => c.frameKey).map((c) => [c.frameKey, c]))
  const manual = current.filter((c) => !c.frameKey)
  const fromFrame = cutList.map((line) => {
    const old = byKey.get(line.key)
    const keepOverride = old && old.overrideReason && old.length !== formatInput(line.length)
    return {
      partId: pipePartId,
      label: line.label,
      length: keepOverride ? old.length : formatInput(line.length),
      quantity: String(line.quantity),
      frameKey: line.key,
      calculatedLength: line.length,
      overrideReason: keepOverride ? old.overrideReason : '',
    }
  })
  return [...fromFrame, ...manual]
}

/**
 * The frame calculator on the revision page: the planner types the tote and fitting figures and the
 * cut list, its derivation and the sprayer holes update as they type. "Use this cut list" copies the
 * result into the revision's cut parts, keeping any override that still applies.
 */
export function FramePanel({ pipes, readOnly }: { pipes: Part[]; readOnly: boolean }) {
  const { getValues, setValue } = useFormContext<RevisionFormValues>()
  const { unit, parse, format, formatInput } = useLengthUnit()
  const frame = useWatch<RevisionFormValues, 'frame'>({ name: 'frame' })
  const hasFrame = useWatch<RevisionFormValues, 'hasFrame'>({ name: 'hasFrame' })
  const converted = useMemo(() => frameInputsFrom(frame, parse), [frame, parse])
  const result = useMemo(() => (converted.value ? computeFrame(converted.value, { unit }) : null), [converted, unit])

  const useCutList = () => {
    if (!result) return
    setValue('cutParts', mergeCutList(getValues('cutParts'), result.cutList, frame.pipePartId, formatInput), { shouldDirty: true })
  }

  if (!hasFrame) {
    return (
      <Section title="Frame calculator" id="frame">
        <p className="text-stone-600">This revision's cut parts are entered by hand.</p>
        {!readOnly && (
          <Button variant="secondary" onClick={() => setValue('hasFrame', true, { shouldDirty: true })}>
            Derive the cut parts from the tote
          </Button>
        )}
      </Section>
    )
  }

  return (
    <Section title="Frame calculator" id="frame">
      <FrameFigures pipes={pipes} inputErrors={converted.errors} />
      {result && (
        <div className="space-y-3" aria-live="polite">
          {result.warnings.map((w) => (
            <p
              key={w.message}
              role={w.severity === 'error' ? 'alert' : undefined}
              className={w.severity === 'error' ? 'rounded-md bg-red-50 p-2 text-red-800' : 'rounded-md bg-amber-50 p-2 text-amber-900'}
            >
              {w.message}
            </p>
          ))}
          <div className="flex flex-wrap items-center justify-between gap-2">
            <h3 className="text-lg font-bold">
              Calculated cut list: {result.pieceCount} pieces, {format(result.totalCutLength)} of pipe
            </h3>
            {!readOnly && (
              <Button onClick={useCutList} disabled={!result.ok || !frame.pipePartId}>
                Use this cut list
              </Button>
            )}
          </div>
          <CutListTable cutList={result.cutList} format={format} />
          <details>
            <summary className="cursor-pointer font-bold">Frame derivation and sprayer holes ({result.sprayerHoles.length})</summary>
            <ul className="mt-2 list-disc pl-6 text-sm">
              {result.derivation.map((d) => (
                <li key={d}>{d}</li>
              ))}
            </ul>
            <SprayerHolesTable holes={result.sprayerHoles} format={format} />
          </details>
          {result.cautions.map((c) => (
            <Caution key={c}>{c}</Caution>
          ))}
        </div>
      )}
    </Section>
  )
}

/** The pipe and the tote and fitting figures the frame is worked out from. */
function FrameFigures({ pipes, inputErrors }: { pipes: Part[]; inputErrors: Record<string, string> }) {
  const { register, formState } = useFormContext<RevisionFormValues>()
  const errorOf = (name: string) => errorAt(formState.errors, name)
  return (
    <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4">
      <Field label="Pipe" error={errorOf('frame.pipePartId')}>
        <Select {...register('frame.pipePartId')}>
          <option value="">Choose the pipe…</option>
          {pipes.map((p) => (
            <option key={p.id} value={p.id}>
              {p.sku} · {p.name}
            </option>
          ))}
        </Select>
      </Field>
      {FRAME_LENGTH_FIELDS.map((f) => (
        <Field key={f.path} label={f.label} hint={f.hint} error={errorOf(`frame.inputs.${fieldKey(f.path)}`) ?? inputErrors[`frame.inputs.${f.path}`]}>
          <Input {...register(`frame.inputs.${fieldKey(f.path)}`)} />
        </Field>
      ))}
      {FRAME_COUNT_FIELDS.map((f) => (
        <Field key={f.path} label={f.label} error={inputErrors[`frame.inputs.${f.path}`]}>
          <Input inputMode="numeric" {...register(`frame.inputs.${fieldKey(f.path)}`)} />
        </Field>
      ))}
      <Field label="Riser tee on the">
        <Select {...register('frame.riserSide')}>
          <option value="short">front short side</option>
          <option value="long">left long side</option>
        </Select>
      </Field>
    </div>
  )
}

/** Each calculated piece with how its length is worked out. */
function CutListTable({ cutList, format }: { cutList: FrameResult['cutList']; format: Format }) {
  return (
    <table className="w-full text-left" aria-label="Calculated cut list">
      <thead className="text-sm text-stone-600">
        <tr>
          <th className="py-1">Piece</th>
          <th>Qty</th>
          <th>Length</th>
          <th>How it is worked out</th>
        </tr>
      </thead>
      <tbody>
        {cutList.map((line) => (
          <tr key={line.key} className="border-t border-stone-200 align-top">
            <td className="py-1 pr-2 font-bold">{line.label}</td>
            <td className="pr-2">{line.quantity}</td>
            <td className="pr-2 font-bold whitespace-nowrap">{format(line.length)}</td>
            <td className="text-sm text-stone-700">
              {line.derivation.map((d) => (
                <div key={d}>{d}</div>
              ))}
            </td>
          </tr>
        ))}
      </tbody>
    </table>
  )
}

/** Where each sprayer hole is drilled, from the datum and on its piece. */
function SprayerHolesTable({ holes, format }: { holes: FrameResult['sprayerHoles']; format: Format }) {
  return (
    <table className="mt-2 w-full text-left text-sm">
      <thead className="text-stone-600">
        <tr>
          <th>Run</th>
          <th>Hole</th>
          <th>From the datum</th>
          <th>On piece, from its end</th>
        </tr>
      </thead>
      <tbody>
        {holes.map((h) => (
          <tr key={`${h.run}-${h.number}`} className="border-t border-stone-100">
            <td>{h.run}</td>
            <td>{h.number}</td>
            <td>
              {format(h.fromDatum)} from {h.datum}
            </td>
            <td>
              {h.piece}: {format(h.fromPieceEnd)} from the {h.pieceEnd}
            </td>
          </tr>
        ))}
      </tbody>
    </table>
  )
}
