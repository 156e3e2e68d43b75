import { computeFrame } from '@kitwright/shared/domain/frame'
import { formatLength } from '@kitwright/shared/domain/units'
import type { RevisionContent } from '@kitwright/shared/kits'
import type { PartRow } from '../../db/schema/index'
import { BadRequest } from '../../lib/http-errors'

/**
 * Checks a draft's content against the catalog and the frame calculator, and works out each
 * frame-linked cut part's calculated length on the server (the client's figure is not trusted).
 * Returns the calculated length per cut part (null when not linked to a frame line).
 */
export function checkRevisionContent(content: RevisionContent, partsById: Map<string, PartRow>): (number | null)[] {
  const fields: Record<string, string> = {}
  content.bomLines.forEach((line, i) => {
    const part = partsById.get(line.partId)
    if (!part) fields[`bomLines.${i}.partId`] = 'No such part'
    else if (part.kind === 'stock_length') fields[`bomLines.${i}.partId`] = `${part.sku} is pipe: add it as a cut part instead`
  })
  content.cutParts.forEach((cut, i) => {
    const part = partsById.get(cut.partId)
    if (!part) fields[`cutParts.${i}.partId`] = 'No such part'
    else if (part.kind !== 'stock_length') fields[`cutParts.${i}.partId`] = `${part.sku} is not pipe; cut parts come from a stock length`
    else if (cut.length > Math.max(0, ...part.stickLengths)) {
      fields[`cutParts.${i}.length`] = `Longer than the longest stick of ${part.sku} (${formatLength(Math.max(0, ...part.stickLengths), 'in')})`
    }
  })
  if (content.frame) {
    const pipe = partsById.get(content.frame.pipePartId)
    if (!pipe || pipe.kind !== 'stock_length') fields['frame.pipePartId'] = 'Choose a pipe (stock length) part'
  }

  const frameLines = content.frame ? computeFrame(content.frame.inputs).cutList : []
  const byKey = new Map(frameLines.map((l) => [l.key, l]))
  const calculated = content.cutParts.map((cut, i) => {
    if (cut.frameKey === null) return null
    const line = byKey.get(cut.frameKey)
    if (!line) {
      fields[`cutParts.${i}.frameKey`] = content.frame
        ? `The frame calculator has no line "${cut.frameKey}" for these inputs; recalculate the cut list`
        : 'This cut part comes from the frame calculator, but the revision has no frame'
      return null
    }
    if (cut.quantity !== line.quantity) {
      fields[`cutParts.${i}.quantity`] = `The frame needs ${line.quantity} of ${line.label}`
    }
    if (cut.length !== line.length && !cut.overrideReason) {
      fields[`cutParts.${i}.overrideReason`] =
        `Say why ${cut.label} differs from the calculated ${formatLength(line.length, 'in')}`
    }
    return line.length
  })
  if (Object.keys(fields).length > 0) {
    throw new BadRequest(`Fix ${Object.keys(fields).length === 1 ? 'this field' : 'these fields'}: ${Object.values(fields)[0]}`, fields)
  }
  return calculated
}

/** What stops a draft from being released, one message per problem (empty when it may be). */
export function releaseProblems(content: RevisionContent): string[] {
  const problems: string[] = []
  if (content.bomLines.length === 0 && content.cutParts.length === 0) problems.push('Add the bill of materials and the cut parts')
  if (content.buildSteps.length === 0) problems.push('Add the build steps')
  // A unit with a manifold is run wet before it ships; a bag of spare parts is not.
  if (content.leakTest === null && content.cutParts.length > 0) problems.push('Set the leak test protocol')
  if (content.frame) {
    const result = computeFrame(content.frame.inputs)
    for (const w of result.warnings.filter((w) => w.severity === 'error')) problems.push(`Frame: ${w.message}`)
    const linked = new Set(content.cutParts.map((c) => c.frameKey).filter((k) => k !== null))
    for (const line of result.cutList) if (!linked.has(line.key)) problems.push(`The cut list lacks the frame's ${line.label}`)
  }
  return problems
}
