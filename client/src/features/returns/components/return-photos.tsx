import { useState } from 'react'
import type { Return } from '@kitwright/shared/returns'
import { useUploadReturnPhoto } from '../api/return-queries'
import { PhotoProblem, TakePhoto, photoFileProblem } from '../../../components/ui/take-photo'

/** The return's photos, and a button that opens the tablet's rear camera (or a file chooser on a PC). */
export function ReturnPhotos({ ret }: { ret: Return }) {
  const upload = useUploadReturnPhoto()
  const [problem, setProblem] = useState<string | null>(null)
  const onFile = (file: File | undefined) => {
    if (!file) return
    const refused = photoFileProblem(file)
    setProblem(refused)
    if (refused) return
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
      <TakePhoto label="Photo of the returned unit" pending={upload.isPending} onFile={onFile} />
      <PhotoProblem problem={problem} />
    </div>
  )
}
