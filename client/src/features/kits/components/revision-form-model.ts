import type { FrameInputs } from '@kitwright/shared/domain/frame'
import type { EnclosureShape } from '@kitwright/shared/domain/reservoir'
import type { Length, ParseLengthResult } from '@kitwright/shared/domain/units'
import { PASCALS_PER_PSI, type RevisionContent, type RevisionDetail } from '@kitwright/shared/kits'

/**
 * The revision editor keeps what people type (lengths like `4-1/4"`, pressures in psi) as text, and
 * turns it into the API's integers only on save or for the live calculator. Field paths match the
 * API's, so a 400's `fields` land on the right input.
 */

type Parse = (text: string) => ParseLengthResult
type Format = (value: Length) => string

/** Frame calculator inputs, with the words the planner sees. */
export const FRAME_LENGTH_FIELDS: { path: string; label: string; hint?: string }[] = [
  { path: 'enclosure.insideWidth', label: 'Tote inside width at the manifold' },
  { path: 'enclosure.insideLength', label: 'Tote inside length at the manifold' },
  { path: 'enclosure.insideHeight', label: 'Tote inside height, floor to rim' },
  { path: 'recessBelowRim', label: 'Manifold recess below the rim', hint: 'About 2 in is common practice' },
  { path: 'wallClearance', label: 'Clearance to the walls' },
  { path: 'pipeOutsideDiameter', label: 'Pipe outside diameter', hint: '1/2 in Schedule 40 PVC: 0.840 in (ASTM D1785)' },
  {
    path: 'elbow.socketDepth',
    label: 'Elbow socket depth',
    hint: 'How far the pipe enters: 0.688 in for 1/2 in Schedule 40 socket fittings (ASTM D2466 socket table, least socket length); measure your own',
  },
  { path: 'elbow.centreToSocketBottom', label: 'Elbow centre to socket bottom' },
  { path: 'tee.socketDepth', label: 'Tee socket depth' },
  { path: 'tee.centreToSocketBottom', label: 'Tee centre to socket bottom' },
  { path: 'sprayers.minDistanceFromFitting', label: 'Least distance from a hole to a fitting' },
  { path: 'riser.pumpOutletHeight', label: 'Pump outlet height above the floor' },
  { path: 'riser.pumpAdapter.socketDepth', label: 'Pump adapter socket depth' },
  { path: 'riser.pumpAdapter.socketBottomAboveOutlet', label: 'Adapter socket bottom above the outlet' },
  { path: 'cutPrecision', label: 'Round cuts to the nearest', hint: 'e.g. 1/16 in' },
]

export const FRAME_COUNT_FIELDS: { path: string; label: string }[] = [
  { path: 'layout.crossRuns', label: 'Cross runs' },
  { path: 'sprayers.perLongSide', label: 'Sprayers per long side' },
  { path: 'sprayers.perShortSide', label: 'Sprayers per short side' },
  { path: 'sprayers.perCrossRun', label: 'Sprayers per cross run' },
]

export const TOTE_FIELDS: { path: keyof EnclosureShape; label: string }[] = [
  { path: 'topInsideWidth', label: 'Inside width at the rim' },
  { path: 'topInsideLength', label: 'Inside length at the rim' },
  { path: 'bottomInsideWidth', label: 'Inside width on the floor' },
  { path: 'bottomInsideLength', label: 'Inside length on the floor' },
  { path: 'insideHeight', label: 'Inside height' },
]

export type PressureUnit = 'psi' | 'kPa'

export interface RevisionFormValues {
  notes: string
  hasFrame: boolean
  frame: { pipePartId: string; riserSide: 'long' | 'short'; inputs: Record<string, string>; hasTote: boolean; tote: Record<string, string> }
  hasLeakTest: boolean
  leakTest: { pressureUnit: PressureUnit; minPressure: string; maxPressure: string; holdMinutes: string; maxDrop: string; waterLitres: string }
  bomLines: { partId: string; quantity: string; note: string }[]
  cutParts: { partId: string; label: string; length: string; quantity: string; frameKey: string; calculatedLength: number | null; overrideReason: string }[]
  buildSteps: {
    text: string
    caution: string
    photoRequired: boolean
    measurementRequired: boolean
    measurementUnit: string
    measurementMin: string
    measurementMax: string
    freeOrder: boolean
    outOfLimitsRework: boolean
  }[]
}

function getPath(obj: unknown, path: string): unknown {
  return path.split('.').reduce<unknown>((o, k) => (o && typeof o === 'object' ? (o as Record<string, unknown>)[k] : undefined), obj)
}
function setPath(obj: Record<string, unknown>, path: string, value: unknown) {
  const keys = path.split('.')
  let o = obj
  for (const k of keys.slice(0, -1)) o = (o[k] ??= {}) as Record<string, unknown>
  o[keys[keys.length - 1]!] = value
}

/** Flat text form of the frame inputs, keyed by path with the dots written as `__` (form field names). */
export const fieldKey = (path: string) => path.replaceAll('.', '__')

const pressureText = (pa: number, unit: PressureUnit) => String(Math.round((unit === 'psi' ? pa / PASCALS_PER_PSI : pa / 1000) * 100) / 100)
const numberText = (n: number | null) => (n === null ? '' : String(n))

export function toFormValues(rev: RevisionDetail, format: Format): RevisionFormValues {
  const frame = rev.frame
  const inputs: Record<string, string> = {}
  for (const f of FRAME_LENGTH_FIELDS) inputs[fieldKey(f.path)] = frame ? format(getPath(frame.inputs, f.path) as number) : ''
  for (const f of FRAME_COUNT_FIELDS) inputs[fieldKey(f.path)] = frame ? String(getPath(frame.inputs, f.path)) : '0'
  const tote: Record<string, string> = {}
  for (const f of TOTE_FIELDS) tote[f.path] = frame?.tote ? format(frame.tote[f.path]) : ''
  const lt = rev.leakTest
  return {
    notes: rev.notes ?? '',
    hasFrame: frame !== null,
    frame: { pipePartId: frame?.pipePartId ?? '', riserSide: frame?.inputs.layout.riserSide ?? 'short', inputs, hasTote: !!frame?.tote, tote },
    hasLeakTest: lt !== null,
    leakTest: {
      pressureUnit: 'psi',
      minPressure: lt ? pressureText(lt.minPressurePa, 'psi') : '',
      maxPressure: lt ? pressureText(lt.maxPressurePa, 'psi') : '',
      holdMinutes: lt ? String(lt.holdMinutes) : '',
      maxDrop: lt ? pressureText(lt.maxDropPa, 'psi') : '',
      waterLitres: lt ? String(lt.waterVolumeMl / 1000) : '',
    },
    bomLines: rev.bomLines.map((l) => ({ partId: l.partId, quantity: String(l.quantity), note: l.note ?? '' })),
    cutParts: rev.cutParts.map((c) => ({
      partId: c.partId,
      label: c.label,
      length: format(c.length),
      quantity: String(c.quantity),
      frameKey: c.frameKey ?? '',
      calculatedLength: c.calculatedLength,
      overrideReason: c.overrideReason ?? '',
    })),
    buildSteps: rev.buildSteps.map((s) => ({
      text: s.text,
      caution: s.caution ?? '',
      photoRequired: s.photoRequired,
      measurementRequired: s.measurementRequired,
      measurementUnit: s.measurementUnit ?? '',
      measurementMin: numberText(s.measurementMin),
      measurementMax: numberText(s.measurementMax),
      freeOrder: s.freeOrder,
      outOfLimitsRework: s.outOfLimitsRework,
    })),
  }
}

export interface Converted<T> {
  value: T | null
  errors: Record<string, string>
}

function wholeNumber(text: string): number | null {
  return /^\s*\d+\s*$/.test(text) ? Number(text) : null
}

/** The frame calculator's inputs from the form, or the message per field that does not read. */
export function frameInputsFrom(values: RevisionFormValues['frame'], parse: Parse): Converted<FrameInputs> {
  const errors: Record<string, string> = {}
  const out: Record<string, unknown> = {}
  for (const f of FRAME_LENGTH_FIELDS) {
    const r = parse(values.inputs[fieldKey(f.path)] ?? '')
    if (r.ok) setPath(out, f.path, r.value)
    else errors[`frame.inputs.${f.path}`] = r.message
  }
  for (const f of FRAME_COUNT_FIELDS) {
    const n = wholeNumber(values.inputs[fieldKey(f.path)] ?? '')
    if (n === null) errors[`frame.inputs.${f.path}`] = 'Enter a whole number'
    else setPath(out, f.path, n)
  }
  setPath(out, 'layout.riserSide', values.riserSide)
  return Object.keys(errors).length ? { value: null, errors } : { value: out as unknown as FrameInputs, errors }
}

export function toteFrom(values: RevisionFormValues['frame'], parse: Parse): Converted<EnclosureShape> {
  const errors: Record<string, string> = {}
  const out: Partial<EnclosureShape> = {}
  for (const f of TOTE_FIELDS) {
    const r = parse(values.tote[f.path] ?? '')
    if (r.ok) out[f.path] = r.value
    else errors[`frame.tote.${f.path}`] = r.message
  }
  return Object.keys(errors).length ? { value: null, errors } : { value: out as EnclosureShape, errors }
}

function decimal(text: string): number | null {
  const t = text.trim()
  return /^-?\d+(\.\d+)?$/.test(t) ? Number(t) : null
}

/** The API's content from the form, or the message per field that does not read. */
export function toContent(values: RevisionFormValues, parse: Parse): Converted<RevisionContent> {
  const errors: Record<string, string> = {}
  let frame: RevisionContent['frame'] = null
  if (values.hasFrame) {
    const inputs = frameInputsFrom(values.frame, parse)
    const tote = values.frame.hasTote ? toteFrom(values.frame, parse) : { value: null, errors: {} }
    Object.assign(errors, inputs.errors, tote.errors)
    if (!values.frame.pipePartId) errors['frame.pipePartId'] = 'Choose the pipe the frame is cut from'
    if (inputs.value) frame = { pipePartId: values.frame.pipePartId, inputs: inputs.value, tote: tote.value }
  }
  let leakTest: RevisionContent['leakTest'] = null
  if (values.hasLeakTest) {
    const lt = values.leakTest
    const toPa = (text: string, path: string) => {
      const n = decimal(text)
      if (n === null || n < 0) {
        errors[`leakTest.${path}`] = `Enter a pressure in ${lt.pressureUnit}`
        return 0
      }
      return Math.round(lt.pressureUnit === 'psi' ? n * PASCALS_PER_PSI : n * 1000)
    }
    const hold = wholeNumber(lt.holdMinutes)
    if (hold === null) errors['leakTest.holdMinutes'] = 'Enter whole minutes'
    const litres = decimal(lt.waterLitres)
    if (litres === null) errors['leakTest.waterVolumeMl'] = 'Enter the water volume in litres'
    leakTest = {
      minPressurePa: toPa(lt.minPressure, 'minPressurePa'),
      maxPressurePa: toPa(lt.maxPressure, 'maxPressurePa'),
      holdMinutes: hold ?? 0,
      maxDropPa: toPa(lt.maxDrop, 'maxDropPa'),
      waterVolumeMl: Math.round((litres ?? 0) * 1000),
    }
  }
  const bomLines = values.bomLines.map((l, i) => {
    const q = wholeNumber(l.quantity)
    if (q === null) errors[`bomLines.${i}.quantity`] = 'Enter a whole number'
    return { partId: l.partId, quantity: q ?? 0, note: l.note || null }
  })
  const cutParts = values.cutParts.map((c, i) => {
    const len = parse(c.length)
    if (!len.ok) errors[`cutParts.${i}.length`] = len.message
    const q = wholeNumber(c.quantity)
    if (q === null) errors[`cutParts.${i}.quantity`] = 'Enter a whole number'
    return {
      partId: c.partId,
      label: c.label,
      length: len.ok ? len.value : 0,
      quantity: q ?? 0,
      frameKey: c.frameKey || null,
      overrideReason: c.overrideReason || null,
    }
  })
  const buildSteps = values.buildSteps.map((s, i) => {
    const limit = (text: string, key: 'measurementMin' | 'measurementMax') => {
      if (!s.measurementRequired || text.trim() === '') return null
      const n = decimal(text)
      if (n === null) errors[`buildSteps.${i}.${key}`] = 'Enter a number'
      return n
    }
    return {
      text: s.text,
      caution: s.caution || null,
      photoRequired: s.photoRequired,
      measurementRequired: s.measurementRequired,
      measurementUnit: s.measurementRequired ? s.measurementUnit || null : null,
      measurementMin: limit(s.measurementMin, 'measurementMin'),
      measurementMax: limit(s.measurementMax, 'measurementMax'),
      freeOrder: s.freeOrder,
      outOfLimitsRework: s.measurementRequired && s.outOfLimitsRework,
    }
  })
  if (Object.keys(errors).length) return { value: null, errors }
  return { value: { notes: values.notes || null, frame, leakTest, bomLines, cutParts, buildSteps }, errors }
}

/** Maps an API field path onto the form's field name (frame inputs are stored flat in the form). */
export function formFieldFor(apiPath: string): string {
  const m = /^frame\.inputs\.(.+)$/.exec(apiPath)
  if (m) return m[1] === 'layout.riserSide' ? 'frame.riserSide' : `frame.inputs.${fieldKey(m[1]!)}`
  if (apiPath.startsWith('leakTest.')) {
    const key = apiPath.slice('leakTest.'.length)
    const map: Record<string, string> = {
      minPressurePa: 'minPressure',
      maxPressurePa: 'maxPressure',
      maxDropPa: 'maxDrop',
      waterVolumeMl: 'waterLitres',
      holdMinutes: 'holdMinutes',
    }
    return `leakTest.${map[key] ?? key}`
  }
  return apiPath
}
