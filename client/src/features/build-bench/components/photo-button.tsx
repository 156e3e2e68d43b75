import { useState } from 'react'
import { toast } from 'sonner'
import { MAX_PHOTO_BYTES, PHOTO_CONTENT_TYPES } from '@kitwright/shared/build'
import { cn } from '../../../lib/cn'
import { useUploadPhoto } from '../api/build-bench-actions'

/**
 * Opens the tablet's rear camera (or a file chooser on a PC) and uploads the photo straight to the
 * photo store. Problems are said on the spot: the ticks already made never depend on the store.
 */
export function PhotoButton({ code, workOrderId, stepId, label }: { code: string; workOrderId: string; stepId: string | null; label: string }) {
  const upload = useUploadPhoto(code)
  const [problem, setProblem] = useState<string | null>(null)
  const onFile = (file: File | undefined) => {
    if (!file) return
    setProblem(null)
    if (!(PHOTO_CONTENT_TYPES as readonly string[]).includes(file.type)) {
      setProblem(`This is a ${file.type || 'file of unknown type'}; photos must be JPEG, PNG or WebP. Set the camera to JPEG.`)
      return
    }
    if (file.size > MAX_PHOTO_BYTES) {
      setProblem(`The photo is ${(file.size / 1024 / 1024).toFixed(1)} MB, over the 10 MB limit; take it at a lower resolution.`)
      return
    }
    upload.mutate(
      { workOrderId, stepId, file, what: label },
      {
        // Offline, the photo stays on this tablet (the banner shows it waiting) until the photo store has it.
        onSuccess: (page) =>
          page ? toast.success('Photo saved') : toast.info('No network: the photo is kept on this tablet and uploaded when the network is back'),
        onError: (err) => setProblem(err.message),
      },
    )
  }
  return (
    <div className="space-y-2">
      <label
        className={cn(
          'inline-flex h-14 min-w-14 cursor-pointer items-center justify-center gap-2 rounded-md border-2 border-brand-700 bg-white px-6 text-lg font-bold text-brand-900 focus-within:outline-3 focus-within:outline-brand-600',
          upload.isPending && 'cursor-wait opacity-60',
        )}
      >
        {upload.isPending ? 'Uploading…' : 'Take photo'}
        <input
          type="file"
          accept="image/*"
          capture="environment"
          aria-label={label}
          className="sr-only"
          disabled={upload.isPending}
          onChange={(e) => {
            onFile(e.target.files?.[0])
            e.target.value = ''
          }}
        />
      </label>
      {problem && (
        <p role="alert" className="rounded-md border-2 border-red-600 bg-red-50 p-3 text-lg text-red-800">
          {problem}
        </p>
      )}
    </div>
  )
}
