import { useMutation } from '@tanstack/react-query'
import { ScanResultSchema, type ScanResult } from '@kitwright/shared/scan'
import { apiFetch } from '../../../lib/api-client'

/** Looks a scanned code up: what it is and where it goes next. */
export function useResolveScan(options: { onSuccess?: (result: ScanResult) => void } = {}) {
  return useMutation({
    mutationFn: (code: string) => apiFetch(`/scan/${encodeURIComponent(code)}`, ScanResultSchema),
    onSuccess: options.onSuccess,
  })
}
