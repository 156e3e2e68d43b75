import type { UseMutationResult } from '@tanstack/react-query'
import { useState } from 'react'
import { toast } from 'sonner'
import { ApiError } from './api-client'

/**
 * The state of a CSV import screen: the text, the preview of exactly that text (a preview of older
 * text does not count), and the row errors to show — from the import when it was refused, else from
 * the preview.
 */
export function useCsvImport<P extends { errors: unknown[] }>(preview: UseMutationResult<P, Error, string, unknown>) {
  const [csv, setCsv] = useState('')
  const [checked, setChecked] = useState<{ csv: string; preview: P } | null>(null)
  const [importErrors, setImportErrors] = useState<P['errors'] | null>(null)
  const runPreview = (text: string) => {
    setImportErrors(null)
    preview.mutate(text, {
      onSuccess: (p) => setChecked({ csv: text, preview: p }),
      onError: (err) => toast.error(err instanceof ApiError ? err.message : 'Could not reach Kitwright'),
    })
  }
  const current = checked && checked.csv === csv ? checked.preview : null
  const errors: P['errors'] = importErrors && importErrors.length > 0 ? importErrors : (current?.errors ?? [])
  return { csv, setCsv, runPreview, previewing: preview.isPending, current, errors, setImportErrors }
}
