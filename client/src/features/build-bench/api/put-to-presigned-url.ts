import type { PresignedPhoto } from '@kitwright/shared/build'

/** The upload failed before the server saw it: the store answered no, or could not be reached. */
export class PhotoUploadError extends Error {}

/**
 * Sends the file straight to the photo store with the presigned PUT (not through the API, which is
 * why this is not `apiFetch`). The headers must be exactly those signed.
 */
export async function putToPresignedUrl(presigned: PresignedPhoto, file: Blob): Promise<void> {
  let res: Response
  try {
    res = await fetch(presigned.url, { method: presigned.method, headers: presigned.headers, body: file })
  } catch {
    throw new PhotoUploadError('The photo store could not be reached, so the photo was not saved. Your ticks are kept; try the photo again in a moment.')
  }
  if (!res.ok) throw new PhotoUploadError(`The photo store refused the upload (${res.status}); take the photo again.`)
}
