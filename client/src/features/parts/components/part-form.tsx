import { zodResolver } from '@hookform/resolvers/zod'
import { useForm, useWatch } from 'react-hook-form'
import type { z } from 'zod'
import { PART_KINDS, PART_KIND_LABELS, PartInputSchema, type Part, type PartInput } from '@kitwright/shared/parts'
import { parseDollars } from '@kitwright/shared/parts-csv'
import { formatHsCode } from '@kitwright/shared/customs'
import { formatLengthForInput } from '@kitwright/shared/domain/units'
import type { Length } from '@kitwright/shared/domain/units'
import { Button } from '../../../components/ui/button'
import { Field, Input, Select } from '../../../components/ui/field'
import { applyServerErrors } from '../../../lib/form-errors'
import { useLengthUnit } from '../../../lib/shop-settings'
import { centsToText } from './money'
import { ParsedTextField, type TextParse } from './parsed-text-field'

type Values = z.input<typeof PartInputSchema>

const EMPTY: Values = {
  sku: '',
  name: '',
  kind: 'hardware',
  unitOfMeasure: 'each',
  unitCostCents: 0,
  weightGrams: 0,
  electrical: false,
  lotTracked: false,
  supplier: '',
  leadTimeDays: null,
  reorderPoint: 0,
  reorderQuantity: 0,
  shelfLocation: '',
  nominalSize: '',
  outsideDiameter: null,
  stickLengths: [],
  hsCode: '',
  originCountry: '',
  customsDescription: '',
}

function toValues(part: Part): Values {
  const { id: _id, active: _a, createdAt: _c, updatedAt: _u, ...input } = part
  return {
    ...input,
    unitCostCents: input.unitCostCents ?? 0,
    supplier: input.supplier ?? '',
    shelfLocation: input.shelfLocation ?? '',
    nominalSize: input.nominalSize ?? '',
    hsCode: input.hsCode ? formatHsCode(input.hsCode) : '',
    originCountry: input.originCountry ?? '',
    customsDescription: input.customsDescription ?? '',
  }
}

const wholeOrNull = (v: unknown) => (v === null || v === undefined || String(v).trim() === '' ? null : Number(v))

interface Props {
  part?: Part
  submitLabel: string
  pending: boolean
  /** Saves; a rejection with the server's 400/409 puts its field hints on the form. */
  onSubmit: (input: PartInput) => Promise<unknown>
}

/** Create or edit a part. Lengths are typed in the shop's unit, the cost in dollars. */
export function PartForm({ part, submitLabel, pending, onSubmit }: Props) {
  const form = useForm<Values, unknown, PartInput>({ resolver: zodResolver(PartInputSchema), defaultValues: part ? toValues(part) : EMPTY })
  const { unit, parse } = useLengthUnit()
  const kind = useWatch({ control: form.control, name: 'kind' })
  const { errors } = form.formState
  const lengthText = (v: Length) => formatLengthForInput(v, unit)
  const parseOptionalLength = (text: string): TextParse<number | null> => (text.trim() === '' ? { ok: true, value: null } : parse(text))
  const parseLengthList = (text: string): TextParse<number[]> => {
    const values: number[] = []
    for (const piece of text
      .split(/[;,]/)
      .map((s) => s.trim())
      .filter(Boolean)) {
      const r = parse(piece)
      if (!r.ok) return { ok: false, message: `"${piece}": ${r.message}` }
      values.push(r.value)
    }
    return { ok: true, value: values }
  }
  const parseCost = (text: string): TextParse<number> => {
    const cents = parseDollars(text)
    return cents === null ? { ok: false, message: 'Enter dollars and cents, e.g. 12.34' } : { ok: true, value: cents }
  }
  const example = unit === 'mm' ? '21.3 mm' : '0.840 in'
  return (
    <form
      noValidate
      aria-label="Part"
      className="grid gap-4 rounded-lg border border-stone-300 bg-white p-4 md:grid-cols-3"
      onSubmit={form.handleSubmit((input) => onSubmit(input).catch((err: unknown) => applyServerErrors(err, form.setError)))}
    >
      <Field label="SKU" error={errors.sku?.message}>
        <Input aria-invalid={!!errors.sku} {...form.register('sku')} />
      </Field>
      <Field label="Name" error={errors.name?.message}>
        <Input aria-invalid={!!errors.name} {...form.register('name')} />
      </Field>
      <Field label="Kind" error={errors.kind?.message}>
        <Select
          {...form.register('kind', {
            // Only pipe has pipe fields; clear them so a part changed to hardware is not refused for them.
            onChange: (e: { target: { value: string } }) => {
              if (e.target.value !== 'stock_length') {
                form.setValue('stickLengths', [])
                form.setValue('outsideDiameter', null)
                form.setValue('nominalSize', '')
              }
            },
          })}
        >
          {PART_KINDS.map((k) => (
            <option key={k} value={k}>
              {PART_KIND_LABELS[k]}
            </option>
          ))}
        </Select>
      </Field>
      {kind === 'stock_length' && (
        <>
          <Field label="Nominal size" hint="e.g. 1/2 (inch pipe size)" error={errors.nominalSize?.message}>
            <Input aria-invalid={!!errors.nominalSize} {...form.register('nominalSize')} />
          </Field>
          <ParsedTextField
            control={form.control}
            name="outsideDiameter"
            label="Outside diameter"
            hint={`e.g. ${example}`}
            toText={(v) => (v == null ? '' : lengthText(v))}
            parse={parseOptionalLength}
          />
          <ParsedTextField
            control={form.control}
            name="stickLengths"
            label="Stick lengths"
            hint="Separate with ; e.g. 10 ft; 20 ft"
            toText={(v) => (v ?? []).map(lengthText).join('; ')}
            parse={parseLengthList}
          />
        </>
      )}
      <Field label="Unit of measure" hint="each, stick, ft, bag…" error={errors.unitOfMeasure?.message}>
        <Input aria-invalid={!!errors.unitOfMeasure} {...form.register('unitOfMeasure')} />
      </Field>
      <ParsedTextField
        control={form.control}
        name="unitCostCents"
        label="Unit cost ($)"
        hint="Dollars and cents, e.g. 3.48. Receiving against a purchase order sets it to the moving average of what was paid for the stock on hand"
        toText={(v) => centsToText(v)}
        parse={parseCost}
      />
      <Field label="Weight of one unit (g)" error={errors.weightGrams?.message}>
        <Input inputMode="numeric" aria-invalid={!!errors.weightGrams} {...form.register('weightGrams', { valueAsNumber: true })} />
      </Field>
      <label className="flex items-start gap-3 md:col-span-2">
        <input type="checkbox" className="mt-1 size-5 accent-brand-700" {...form.register('electrical')} />
        <span>
          <span className="block font-bold">Runs on mains power</span>
          <span className="block text-sm text-stone-600">
            A pump, a timer, a light: the care sheet of every box holding it carries the electricity-and-water cautions.
          </span>
        </span>
      </label>
      <label className="flex items-start gap-3 md:col-span-2">
        <input type="checkbox" className="mt-1 size-5 accent-brand-700" {...form.register('lotTracked')} />
        <span>
          <span className="block font-bold">Tracked by the supplier's lot</span>
          <span className="block text-sm text-stone-600">
            Receiving asks for the lot on the bag or box, the build bench records which lot went into each unit, and a recall finds every unit built with a lot.
          </span>
        </span>
      </label>
      <Field label="Supplier" error={errors.supplier?.message}>
        <Input {...form.register('supplier')} />
      </Field>
      <Field label="Lead time (days)" error={errors.leadTimeDays?.message}>
        <Input inputMode="numeric" aria-invalid={!!errors.leadTimeDays} {...form.register('leadTimeDays', { setValueAs: wholeOrNull })} />
      </Field>
      <Field label="Shelf location" error={errors.shelfLocation?.message}>
        <Input {...form.register('shelfLocation')} />
      </Field>
      <Field label="Reorder point" hint="Reorder when on hand falls to this" error={errors.reorderPoint?.message}>
        <Input inputMode="numeric" aria-invalid={!!errors.reorderPoint} {...form.register('reorderPoint', { valueAsNumber: true })} />
      </Field>
      <Field label="Reorder quantity" error={errors.reorderQuantity?.message}>
        <Input inputMode="numeric" aria-invalid={!!errors.reorderQuantity} {...form.register('reorderQuantity', { valueAsNumber: true })} />
      </Field>
      <fieldset className="grid gap-4 rounded-md border border-stone-200 p-3 md:col-span-3 md:grid-cols-3">
        <legend className="px-1 font-bold">Customs (printed on the declaration of shipments abroad)</legend>
        <Field label="HS code" hint="6 to 10 digits, e.g. 8413.70" error={errors.hsCode?.message}>
          <Input aria-invalid={!!errors.hsCode} {...form.register('hsCode')} />
        </Field>
        <Field label="Country of origin" hint="Two letters (ISO 3166-1), e.g. US, CN" error={errors.originCountry?.message}>
          <Input aria-invalid={!!errors.originCountry} maxLength={2} className="uppercase" {...form.register('originCountry')} />
        </Field>
        <Field label="Customs description" hint="Plain words, e.g. Submersible electric water pump" error={errors.customsDescription?.message}>
          <Input aria-invalid={!!errors.customsDescription} {...form.register('customsDescription')} />
        </Field>
        <p className="text-sm text-stone-600 md:col-span-3">
          Net weight is the weight of one unit above; the declared value comes from the order's price. Check HS codes with your customs broker or the tariff of
          the country of import.
        </p>
      </fieldset>
      <div className="flex items-end md:col-span-3">
        <Button type="submit" disabled={pending}>
          {submitLabel}
        </Button>
      </div>
    </form>
  )
}
