import { useState } from 'react'
import { toast } from 'sonner'
import { useUploadPhoto } from '../api/build-bench-actions'
import { PhotoProblem, TakePhoto, photoFileProblem } from '../../../components/ui/take-photo'

/**
 * Opens the tablet's rear camera (or a file chooser on a PC) and uploads the photo straight to the
 * photo store. Problems are said on the spot: the ticks already made never depend on the store.
 */
export function PhotoButton({ code, workOrderId, stepId, label }: { code: string; workOrderId: string; stepId: string | null; label: string }) {
  const upload = useUploadPhoto(code)
  const [problem, setProblem] = useState<string | null>(null)
  const onFile = (file: File | undefined) => {
    if (!file) return
    const refused = photoFileProblem(file)
    setProblem(refused)
    if (refused) return
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
      <TakePhoto label={label} pending={upload.isPending} onFile={onFile} />
      <PhotoProblem problem={problem} />
    </div>
  )
}
