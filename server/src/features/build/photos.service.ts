import { randomUUID } from 'node:crypto'
import { eq } from 'drizzle-orm'
import type { BuildPage, PhotoContentType, PresignedPhoto, PresignPhotoSchema } from '@kitwright/shared/build'
import type { z } from 'zod'
import type { Db } from '../../db/client'
import { unitPhotos } from '../../db/schema/index'
import type { SessionUser } from '../../lib/auth'
import { BadRequest, NotFound } from '../../lib/http-errors'
import type { Storage } from '../../lib/storage'
import { loadBuildPage } from './build-page'
import { findPhotoByKey, findStep, findWorkOrderById } from './build.queries'
import { assertBuildable } from './build.service'

/** A presigned upload is good for ten minutes: time to take the photo again if the first is blurred. */
const UPLOAD_SECONDS = 600

const EXTENSIONS: Record<PhotoContentType, string> = { 'image/jpeg': 'jpg', 'image/png': 'png', 'image/webp': 'webp' }

/**
 * Presigns the browser's upload of one photo of a unit the caller may work on now. The promise (type,
 * size, step) is written down, unconfirmed, so that `confirmPhoto` can check the upload against it.
 */
export async function presignPhoto(
  db: Db,
  storage: Storage,
  workOrderId: string,
  input: z.infer<typeof PresignPhotoSchema>,
  actor: SessionUser,
): Promise<PresignedPhoto> {
  const wo = await findWorkOrderById(db, workOrderId)
  if (!wo) throw new NotFound('No such work order')
  assertBuildable(wo)
  if (input.stepId) {
    const step = await findStep(db, wo.kitRevisionId, input.stepId)
    if (!step) throw new NotFound(`No such step in the revision unit ${wo.serial} is built to`)
  }
  // The serial in the key keeps a unit's photos together in the bucket and readable by people.
  const key = `photos/${wo.serial}/${randomUUID()}.${EXTENSIONS[input.contentType]}`
  const { url, headers } = await storage.presignPut(key, { contentType: input.contentType, size: input.size }, UPLOAD_SECONDS)
  await db.insert(unitPhotos).values({ workOrderId: wo.id, buildStepId: input.stepId, key, contentType: input.contentType, size: input.size, uploadedBy: actor.id })
  return { key, url, method: 'PUT', headers, expiresAt: new Date(Date.now() + UPLOAD_SECONDS * 1000).toISOString() }
}

/** Records a photo once a HEAD finds it in the bucket with the type and size promised at presign. */
export async function confirmPhoto(db: Db, storage: Storage, workOrderId: string, key: string, actor: SessionUser): Promise<BuildPage> {
  const wo = await findWorkOrderById(db, workOrderId)
  if (!wo) throw new NotFound('No such work order')
  const photo = await findPhotoByKey(db, wo.id, key)
  if (!photo) throw new BadRequest(`No upload was presigned for unit ${wo.serial} under this key; take the photo again`, { key: 'Unknown key' })
  if (!photo.uploadedAt) {
    const stored = await storage.head(key)
    if (!stored) throw new BadRequest('The photo is not in the store: the upload did not finish. Take the photo again.', { key: 'Nothing uploaded under this key' })
    if (stored.contentType !== photo.contentType) {
      throw new BadRequest(`The upload is ${stored.contentType ?? 'of no type'}, not the ${photo.contentType} promised; take the photo again`, { key: 'Wrong type' })
    }
    if (stored.size !== photo.size) throw new BadRequest(`The upload is ${stored.size ?? 0} bytes, not the ${photo.size} promised; take the photo again`, { key: 'Wrong size' })
    await db.update(unitPhotos).set({ uploadedAt: new Date(), uploadedBy: actor.id }).where(eq(unitPhotos.id, photo.id))
  }
  return loadBuildPage(db, storage, wo)
}
