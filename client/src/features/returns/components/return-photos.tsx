import { useState } from 'react'
import { MAX_PHOTO_BYTES, PHOTO_CONTENT_TYPES } from '@kitwright/shared/build'
import type { Return } from '@kitwright/shared/returns'
import { cn } from '../../../lib/cn'
import { useUploadReturnPhoto } from '../api/return-queries'

/** The return's photos, and a button that opens the tablet's rear camera (or a file chooser on a PC). */
export function ReturnPhotos({ ret }: { ret: Return }) {
  const upload = useUploadReturnPhoto()
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
    upload.mutate({ id: ret.id, file }, { onError: (err) => setProblem(err.message) })
  }
  return (
    <div className="space-y-3">
      {ret.photos.length === 0 ? (
        <p className="text-stone-600">No photos yet.</p>
      ) : (
        <ul aria-label="Return photos" className="flex flex-wrap gap-3">
          {ret.photos.map((p) => (
            <li key={p.id} className="text-sm text-stone-600">
              {p.url ? (
                <img src={p.url} alt={`Photo by ${p.by.name}`} className="h-32 w-32 rounded-md border border-stone-300 object-cover" />
              ) : (
                <span>Photo (not reachable now)</span>
              )}
              <span className="block">{p.by.name}</span>
            </li>
          ))}
        </ul>
      )}
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
          aria-label="Photo of the returned unit"
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
