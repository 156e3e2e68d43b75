import { useMutation } from '@tanstack/react-query'
import { ScanResultSchema } from '@kitwright/shared/scan'
import { apiFetch } from '../../../lib/api-client'

/** Looks a scanned code up: what it is and where it goes next. */
export function useResolveScan() {
  return useMutation({
    mutationFn: (code: string) => apiFetch(`/scan/${encodeURIComponent(code)}`, ScanResultSchema),
  })
}
