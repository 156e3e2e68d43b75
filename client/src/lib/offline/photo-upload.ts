import { z } from 'zod'
import { PresignedPhotoSchema, type PresignPhotoInput } from '@kitwright/shared/build'
import { NetworkError, apiFetch } from '../api-client'
import { putAction, type QueuedAction } from './action-store'
import { newActionId } from './uuid'
import { BENCH_ACTION_ID_HEADER } from '@kitwright/shared/bench-actions'

/** What a queued photo carries besides the picture: where to ask for its upload, and where to confirm it. */
export const PhotoActionBodySchema = z.object({
  presignPath: z.string(),
  presignBody: z.custom<PresignPhotoInput>(),
  confirmPath: z.string(),
  presigned: PresignedPhotoSchema.optional(),
})
export type PhotoActionBody = z.infer<typeof PhotoActionBodySchema>

/** A presigned upload is reused while it has this much time left. */
const MARGIN_MS = 60_000

/**
 * Sends a queued photo: asks for a presigned upload (kept with the action, so a send after a lost
 * answer PUTs to the same key and confirms the same thing under the same id), PUTs the picture
 * straight to the photo store, then has the server confirm it. The picture stays on the tablet
 * until the confirm goes through. An upload that expired meanwhile gets a new one, and the action a
 * new id (its confirm names another key).
 */
export async function sendPhoto(action: QueuedAction, headers: Record<string, string>, signal: AbortSignal): Promise<unknown> {
  const body = PhotoActionBodySchema.parse(action.body)
  let presigned = body.presigned
  let actionHeaders = headers
  if (!presigned || Date.parse(presigned.expiresAt) - Date.now() < MARGIN_MS) {
    const fresh = await apiFetch(body.presignPath, PresignedPhotoSchema, { method: 'POST', body: body.presignBody, signal })
    const id = presigned ? newActionId() : action.id
    presigned = fresh
    action.id = id
    action.body = { ...body, presigned: fresh }
    await putAction(action)
    actionHeaders = { ...headers, [BENCH_ACTION_ID_HEADER]: id }
  }
  let res: Response
  try {
    res = await fetch(presigned.url, { method: presigned.method, headers: presigned.headers, body: action.photo ?? null, signal })
  } catch (err) {
    throw new NetworkError(err)
  }
  if (!res.ok) throw new Error(`The photo store refused the upload (${res.status}); take the photo again`)
  return apiFetch(body.confirmPath, z.unknown(), { method: 'POST', body: { key: presigned.key }, headers: actionHeaders, signal })
}
