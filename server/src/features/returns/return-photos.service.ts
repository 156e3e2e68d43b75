import { randomUUID } from 'node:crypto'
import { and, eq } from 'drizzle-orm'
import type { PhotoContentType, PresignedPhoto } from '@kitwright/shared/build'
import type { PresignReturnPhotoSchema } from '@kitwright/shared/returns'
import type { z } from 'zod'
import type { Db } from '../../db/client'
import { returnPhotos, returns, workOrders } from '../../db/schema/index'
import type { SessionUser } from '../../lib/auth'
import { BadRequest, NotFound } from '../../lib/http-errors'
import type { Storage } from '../../lib/storage'

/** Ten minutes to take the photo and upload it, as at the build bench. */
const UPLOAD_SECONDS = 600
const EXTENSIONS: Record<PhotoContentType, string> = { 'image/jpeg': 'jpg', 'image/png': 'png', 'image/webp': 'webp' }

/**
 * Presigns the browser's upload of one photo of a returned unit, exactly as the build bench does: the
 * promise (type, size) is written down unconfirmed, and `confirmReturnPhoto` checks the upload against it.
 */
export async function presignReturnPhoto(
  db: Db,
  storage: Storage,
  returnId: string,
  input: z.infer<typeof PresignReturnPhotoSchema>,
  actor: SessionUser,
): Promise<PresignedPhoto> {
  const [ret] = await db
    .select({ id: returns.id, number: returns.number, serial: workOrders.serial })
    .from(returns)
    .innerJoin(workOrders, eq(workOrders.id, returns.workOrderId))
    .where(eq(returns.id, returnId))
  if (!ret) throw new NotFound('No such return')
  // Kept beside the unit's build photos in the bucket, under its serial and the return's number.
  const key = `photos/${ret.serial}/returns/${ret.number}/${randomUUID()}.${EXTENSIONS[input.contentType]}`
  const { url, headers } = await storage.presignPut(key, { contentType: input.contentType, size: input.size }, UPLOAD_SECONDS)
  await db.insert(returnPhotos).values({ returnId: ret.id, key, contentType: input.contentType, size: input.size, uploadedBy: actor.id })
  return { key, url, method: 'PUT', headers, expiresAt: new Date(Date.now() + UPLOAD_SECONDS * 1000).toISOString() }
}

/** Records the photo once a HEAD finds it in the bucket with the type and size promised at presign. */
export async function confirmReturnPhoto(db: Db, storage: Storage, returnId: string, key: string, actor: SessionUser): Promise<void> {
  const [photo] = await db
    .select()
    .from(returnPhotos)
    .where(and(eq(returnPhotos.returnId, returnId), eq(returnPhotos.key, key)))
  if (!photo) throw new BadRequest('No upload was presigned for this return under this key; take the photo again', { key: 'Unknown key' })
  if (photo.uploadedAt) return
  const stored = await storage.head(key)
  if (!stored)
    throw new BadRequest('The photo is not in the store: the upload did not finish. Take the photo again.', { key: 'Nothing uploaded under this key' })
  if (stored.contentType !== photo.contentType)
    throw new BadRequest(`The upload is ${stored.contentType ?? 'of no type'}, not the ${photo.contentType} promised; take the photo again`, {
      key: 'Wrong type',
    })
  if (stored.size !== photo.size)
    throw new BadRequest(`The upload is ${stored.size ?? 0} bytes, not the ${photo.size} promised; take the photo again`, { key: 'Wrong size' })
  await db.update(returnPhotos).set({ uploadedAt: new Date(), uploadedBy: actor.id }).where(eq(returnPhotos.id, photo.id))
}
