import { and, eq } from 'drizzle-orm'
import { formatLength } from '@kitwright/shared/domain/units'
import type { Db } from '../../db/client'
import { cutRunSticks, offcuts, parts } from '../../db/schema/index'
import { NotFound } from '../../lib/http-errors'
import { offcutLabelPdf } from '../labels/offcut-label.pdf'
import { getShopSettings } from '../settings/settings.service'
import { selectRun } from './cut-runs.queries'

/** The label of the offcut a finished stick made. */
export async function offcutLabel(db: Db, runId: string, stickId: string) {
  const run = await selectRun(db, runId)
  const [row] = await db
    .select({ stick: cutRunSticks, offcut: offcuts, sku: parts.sku })
    .from(cutRunSticks)
    .innerJoin(offcuts, eq(offcuts.id, cutRunSticks.offcutId))
    .innerJoin(parts, eq(parts.id, offcuts.partId))
    .where(and(eq(cutRunSticks.id, stickId), eq(cutRunSticks.cutRunId, runId)))
  if (!run || !row) throw new NotFound('This stick has made no offcut (yet)')
  const unit = (await getShopSettings(db)).displayUnit
  const code = row.offcut.code
  const pdf = await offcutLabelPdf({ code, partSku: row.sku, length: formatLength(row.offcut.length, unit), from: `${run.number} stick ${row.stick.position}` })
  return { pdf, code }
}
