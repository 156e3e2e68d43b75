import { queryOptions } from '@tanstack/react-query'
import type { z } from 'zod'
import {
  CutRunYieldReportSchema,
  FirstPassYieldReportSchema,
  LateOrdersReportSchema,
  LeadTimeReportSchema,
  OrderStatesReportSchema,
  ThroughputReportSchema,
  WipReportSchema,
  YieldOverTimeReportSchema,
  type ReportRangeQuery,
} from '@kitwright/shared/reports'
import { ShortagesSchema } from '@kitwright/shared/work-orders'
import { apiFetch } from '../../../lib/api-client'

export const reportKeys = {
  all: ['reports'] as const,
  report: (path: string, q: Record<string, string | number | undefined>) => [...reportKeys.all, path, q] as const,
}

function search(q: Record<string, string | number | undefined>): string {
  const params = new URLSearchParams()
  for (const [k, v] of Object.entries(q)) if (v !== undefined && v !== '') params.set(k, String(v))
  const text = params.toString()
  return text ? `?${text}` : ''
}

/** Where a report's CSV is: the same numbers as the screen (the late list: every late order). */
export function reportCsvHref(path: string, q: Record<string, string | number | undefined> = {}): string {
  return `/api/reports/${path}/export.csv${search(q)}`
}

function reportOptions<S extends z.ZodType>(path: string, schema: S, q: Record<string, string | number | undefined> = {}) {
  return queryOptions({
    queryKey: reportKeys.report(path, q),
    queryFn: ({ signal }) => apiFetch(`/reports/${path}${search(q)}`, schema, { signal }),
  })
}

export const orderStatesOptions = () => reportOptions('order-states', OrderStatesReportSchema)
export const lateOrdersOptions = (limit = 20) => reportOptions('late-orders', LateOrdersReportSchema, { limit })
export const wipOptions = () => reportOptions('work-in-progress', WipReportSchema)
export const throughputOptions = (q: ReportRangeQuery) => reportOptions('throughput', ThroughputReportSchema, q)
export const cutRunYieldOptions = (q: ReportRangeQuery) => reportOptions('cut-run-yield', CutRunYieldReportSchema, q)
export const yieldOverTimeOptions = (q: ReportRangeQuery) => reportOptions('yield-over-time', YieldOverTimeReportSchema, q)
export const firstPassYieldOptions = (q: ReportRangeQuery) => reportOptions('first-pass-yield', FirstPassYieldReportSchema, q)
export const leadTimeOptions = (q: ReportRangeQuery) => reportOptions('lead-time', LeadTimeReportSchema, q)

/** The short parts, from the shortages page's own endpoint. */
export function shortPartsOptions() {
  return queryOptions({
    queryKey: [...reportKeys.all, 'shortages'] as const,
    queryFn: ({ signal }) => apiFetch('/shortages', ShortagesSchema, { signal }),
  })
}
