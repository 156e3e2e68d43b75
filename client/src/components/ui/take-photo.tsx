import { MAX_PHOTO_BYTES, PHOTO_CONTENT_TYPES } from '@kitwright/shared/build'
import { cn } from '../../lib/cn'

/** Why the photo store would refuse this file, in words, before it is sent; null when it may go. */
export function photoFileProblem(file: File): string | null {
  if (!(PHOTO_CONTENT_TYPES as readonly string[]).includes(file.type)) {
    return `This is a ${file.type || 'file of unknown type'}; photos must be JPEG, PNG or WebP. Set the camera to JPEG.`
  }
  if (file.size > MAX_PHOTO_BYTES) return `The photo is ${(file.size / 1024 / 1024).toFixed(1)} MB, over the 10 MB limit; take it at a lower resolution.`
  return null
}

/**
 * The bench's "Take photo" button: a file input that opens the tablet's rear camera. `onFile` gets
 * the picture (the input is cleared, so the same photo can be taken again after a failure).
 */
export function TakePhoto({ label, pending, onFile }: { label: string; pending: boolean; onFile: (file: File | undefined) => void }) {
  return (
    <label
      className={cn(
        'inline-flex h-14 min-w-14 cursor-pointer items-center justify-center gap-2 rounded-md border-2 border-brand-700 bg-white px-6 text-lg font-bold text-brand-900 focus-within:outline-3 focus-within:outline-brand-600',
        pending && 'cursor-wait opacity-60',
      )}
    >
      {pending ? 'Uploading…' : 'Take photo'}
      <input
        type="file"
        accept="image/*"
        capture="environment"
        aria-label={label}
        className="sr-only"
        disabled={pending}
        onChange={(e) => {
          onFile(e.target.files?.[0])
          e.target.value = ''
        }}
      />
    </label>
  )
}

/** What went wrong with the last photo, in words. */
export function PhotoProblem({ problem }: { problem: string | null }) {
  if (!problem) return null
  return (
    <p role="alert" className="rounded-md border-2 border-red-600 bg-red-50 p-3 text-lg text-red-800">
      {problem}
    </p>
  )
}
