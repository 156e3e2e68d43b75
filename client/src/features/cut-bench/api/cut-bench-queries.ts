import { queryOptions, useMutation, useQueryClient } from '@tanstack/react-query'
import { z } from 'zod'
import { CutRunDetailSchema, CutRunSummarySchema, type CutRunDetail } from '@kitwright/shared/cut-runs'
import { apiFetch } from '../../../lib/api-client'
import type { QueuedAction } from '../../../lib/offline/action-store'
import { cancelWaiting, submitBenchAction } from '../../../lib/offline/bench-queue'

export const benchKeys = {
  all: ['cut-bench'] as const,
  runs: () => [...benchKeys.all, 'runs'] as const,
  run: (id: string) => [...benchKeys.all, 'run', id] as const,
}

/** Runs the bench can work: published ones. */
export function benchRunsOptions() {
  return queryOptions({ queryKey: benchKeys.runs(), queryFn: ({ signal }) => apiFetch('/cut-runs?status=published', z.array(CutRunSummarySchema), { signal }) })
}

export function benchRunOptions(id: string) {
  // Another cutter may work the same run: refresh now and then.
  return queryOptions({ queryKey: benchKeys.run(id), queryFn: ({ signal }) => apiFetch(`/cut-runs/${id}`, CutRunDetailSchema, { signal }), refetchInterval: 15_000 })
}

/** A bench action answers with the whole run; the screen shows it at once. */
function useBenchAction<V>(path: (v: V) => string, body?: (v: V) => unknown) {
  const qc = useQueryClient()
  return useMutation({
    mutationFn: (v: V) => apiFetch(path(v), CutRunDetailSchema, { method: 'POST', body: body?.(v) }),
    onSuccess: async (run: CutRunDetail) => {
      // A background refresh started before this action must not paint the older state over it.
      await qc.cancelQueries({ queryKey: benchKeys.run(run.id) })
      qc.setQueryData(benchKeys.run(run.id), run)
      return qc.invalidateQueries({ queryKey: benchKeys.runs() })
    },
  })
}

/**
 * Ticks and undos go through the tablet's queue (lib/offline/): kept first, sent in order, and
 * when the network is down they wait and the bench shows them as taken (`overlayWaiting`). An undo
 * of a tick that has not been sent yet just drops the tick from the queue.
 */
function useQueuedCutAction(kind: 'cut.tick' | 'cut.undo') {
  const qc = useQueryClient()
  return useMutation({
    mutationFn: async (v: { runId: string; cutId: string; what: string }) => {
      if (kind === 'cut.undo' && (await cancelWaiting((a) => a.kind === 'cut.tick' && a.target.cutId === v.cutId))) return null
      const verb = kind === 'cut.tick' ? 'tick' : 'undo'
      const outcome = await submitBenchAction(
        { bench: 'cut', kind, label: `${kind === 'cut.tick' ? 'Cut' : 'Undo'} ${v.what}`, path: `/cut-runs/${v.runId}/cuts/${v.cutId}/${verb}`, target: { runId: v.runId, cutId: v.cutId } },
        CutRunDetailSchema,
      )
      return outcome.sent ? outcome.data : null
    },
    onSuccess: async (run: CutRunDetail | null) => {
      if (!run) return
      await qc.cancelQueries({ queryKey: benchKeys.run(run.id) })
      qc.setQueryData(benchKeys.run(run.id), run)
      return qc.invalidateQueries({ queryKey: benchKeys.runs() })
    },
  })
}

export const useTickCut = () => useQueuedCutAction('cut.tick')
export const useUndoCut = () => useQueuedCutAction('cut.undo')

const NOT_SENT = 'you (not sent yet)'

/**
 * The run as the bench should show it: the server's last answer (or, offline, the last one kept)
 * with this person's ticks and undos that wait in the queue applied, so the pieces tapped offline
 * show as cut, even after a reload.
 */
export function overlayWaiting(run: CutRunDetail, waiting: readonly QueuedAction[]): CutRunDetail {
  const mine = waiting.filter((a) => a.target.runId === run.id)
  if (mine.length === 0) return run
  const status = new Map<string, { cut: boolean; at: string }>()
  for (const a of mine) status.set(a.target.cutId!, { cut: a.kind === 'cut.tick', at: a.takenAt })
  // Pieces each unit gains (or loses) by what waits, for the units' counts beside the stick.
  const gained = new Map<string, number>()
  const gain = (workOrderId: string, n: number) => gained.set(workOrderId, (gained.get(workOrderId) ?? 0) + n)
  const sticks = run.sticks.map((stick) => {
    if (!stick.cuts.some((c) => status.has(c.id))) return stick
    const cuts = stick.cuts.map((c) => {
      const s = status.get(c.id)
      if (!s || c.status === 'replanned') return c
      if (s.cut && c.status === 'pending') {
        gain(c.workOrderId, 1)
        return { ...c, status: 'cut' as const, cutAt: s.at, cutBy: NOT_SENT }
      }
      if (!s.cut && c.status === 'cut') {
        gain(c.workOrderId, -1)
        return { ...c, status: 'pending' as const, cutAt: null, cutBy: null }
      }
      return c
    })
    return { ...stick, cuts, status: stick.status === 'pending' && cuts.some((c) => c.status === 'cut') ? ('in_progress' as const) : stick.status }
  })
  return { ...run, sticks, workOrders: run.workOrders.map((w) => (gained.has(w.id) ? { ...w, cut: w.cut + gained.get(w.id)! } : w)) }
}
export const useDamageStick = () =>
  useBenchAction(
    (v: { runId: string; stickId: string; reason: string; spoiledCutIds: string[] }) => `/cut-runs/${v.runId}/sticks/${v.stickId}/damage`,
    (v) => ({ reason: v.reason, spoiledCutIds: v.spoiledCutIds }),
  )
export const useAssignBin = () =>
  useBenchAction(
    (v: { runId: string; workOrderId: string; code: string }) => `/cut-runs/${v.runId}/bins`,
    (v) => ({ workOrderId: v.workOrderId, code: v.code }),
  )

export function binLabelHref(binId: string) {
  return `/api/bins/labels.pdf?size=2x1&ids=${binId}`
}
export function offcutLabelHref(runId: string, stickId: string) {
  return `/api/cut-runs/${runId}/sticks/${stickId}/offcut-label.pdf`
}
export function benchCutSheetHref(runId: string) {
  return `/api/cut-runs/${runId}/cut-sheet.pdf?paper=letter`
}
