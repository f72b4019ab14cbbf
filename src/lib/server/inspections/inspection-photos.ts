import { randomUUID } from 'node:crypto';
import { getConfig } from '../config';
import { db } from '../db';
import { hasRole, type Role } from '../../schemas/roles';
import { BadRequestError, ConflictError, DomainError, ForbiddenError, NotFoundError, readBytesWithin } from '../http';
import { photoStore, type PhotoStore } from '../photo-storage';
import { recordAudit } from '../repos/audit-log';
import { findCheck, rowToPhoto, type PhotoRow } from '../repos/inspections';
import { processPhoto } from './process-photo';

/** A photo over the size setting: the message says the limit and what to do. */
export class PhotoTooLargeError extends DomainError {
  constructor(limitBytes: number) {
    super(413, `The photo is too large: the limit is ${(limitBytes / (1024 * 1024)).toFixed(0)} MB. Send a smaller photo (lower the camera's resolution, or share it as "medium" size).`);
  }
}

/** Multipart framing and the small form fields beside the photo. */
const FORM_ALLOWANCE_BYTES = 64 * 1024;

/** Reads a request body into memory up to `limitBytes` (the photo limit plus the form's framing). */
async function readBody(request: Request, limitBytes: number, photoLimit: number): Promise<Buffer> {
  if (!request.body) throw new BadRequestError('The upload is empty: take or choose a photo and send it again.');
  return readBytesWithin(request, limitBytes, () => new PhotoTooLargeError(photoLimit));
}

/** A file name as a phone sends it: no folders, no climbing out of one, no control characters. */
function checkFileName(name: string): void {
  if (/[/\\]|\.\.|[\u0000-\u001f]/.test(name)) {
    throw new BadRequestError(`The file name "${name.replace(/[\u0000-\u001f]/g, '?').slice(0, 80)}" contains folders or "..": send the photo itself under a plain name like photo.jpg.`);
  }
}

export type PhotoUpload = { checkId: number; keepLocation: boolean; fileName: string; bytes: Uint8Array };

/**
 * Reads a multipart photo upload (`photo` the file, `checkId`, `keepLocation`), refusing a body
 * over MAX_PHOTO_BYTES (413), a missing or empty file and a path-like file name (400).
 */
export async function readPhotoUpload(request: Request): Promise<PhotoUpload> {
  const type = request.headers.get('content-type') ?? '';
  if (!/^multipart\/form-data\b/i.test(type)) throw new DomainError(415, 'Send the photo as a form upload (multipart/form-data) with the field "photo".');
  const limit = getConfig().maxPhotoBytes;
  const body = await readBody(request, limit + FORM_ALLOWANCE_BYTES, limit);
  let form: FormData;
  try {
    form = await new Response(new Uint8Array(body), { headers: { 'content-type': type } }).formData();
  } catch {
    throw new BadRequestError('The upload could not be read as a form: take or choose the photo again and send it.');
  }
  const file = form.get('photo');
  if (!(file instanceof File)) throw new BadRequestError('No photo in the upload: send it in the field "photo".');
  checkFileName(file.name);
  if (file.size === 0) throw new BadRequestError(`The photo "${file.name}" is empty (0 bytes): take or choose it again and send it.`);
  if (file.size > limit) throw new PhotoTooLargeError(limit);
  const checkId = Number(form.get('checkId'));
  if (!Number.isSafeInteger(checkId) || checkId < 1) throw new BadRequestError('Say which crossing the photo is of (checkId).');
  const keep = String(form.get('keepLocation') ?? '');
  return { checkId, keepLocation: keep === 'true' || keep === 'on' || keep === '1', fileName: file.name, bytes: new Uint8Array(await file.arrayBuffer()) };
}

/**
 * Stores a photo of a check: processed (content checked, metadata dropped unless the uploader
 * keeps the location, thumbnail made), both objects written durably, then the row and its audit
 * entry committed. When the row cannot be written the objects are removed, so none is orphaned.
 */
export async function addPhoto(propertyId: number, upload: PhotoUpload, userId: number, store: PhotoStore = photoStore()) {
  const check = await findCheck(propertyId, upload.checkId);
  if (check.round_status === 'closed') throw new ConflictError('This inspection round is closed. Ask an owner or manager to reopen it to add photos.');
  const photo = await processPhoto(upload.bytes, upload.keepLocation);
  const name = randomUUID();
  const storageKey = `photos/${propertyId}/${name}.${photo.extension}`;
  const thumbnailKey = `photos/${propertyId}/${name}-thumb.jpg`;
  const removeObjects = () => Promise.all([store.remove(storageKey), store.remove(thumbnailKey)]).catch(() => undefined);
  try {
    await store.put(storageKey, photo.bytes, photo.contentType);
    await store.put(thumbnailKey, photo.thumbnail, 'image/jpeg');
    return await db().transaction(async (trx) => {
      // The round may have been closed while the photo was being processed.
      const round = (await trx('inspection_rounds').where({ id: check.round_id }).first('status')) as { status: string };
      if (round.status === 'closed') throw new ConflictError('This inspection round was closed meanwhile. Ask an owner or manager to reopen it to add photos.');
      const [row] = await trx('inspection_photos')
        .insert({
          property_id: propertyId, check_id: check.id, storage_key: storageKey, thumbnail_key: thumbnailKey, content_type: photo.contentType,
          size_bytes: photo.bytes.byteLength, width: photo.width, height: photo.height, location_kept: photo.locationKept, uploaded_by: userId,
          created_at: new Date().toISOString(),
        })
        .returning('*');
      await recordAudit(
        { propertyId, userId, action: 'inspection_photo.create', entityType: 'inspection_photo', entityId: (row as PhotoRow).id, detail: { checkId: check.id, roundId: check.round_id, sizeBytes: photo.bytes.byteLength, locationKept: photo.locationKept } },
        trx,
      );
      return rowToPhoto(row as PhotoRow);
    });
  } catch (error) {
    await removeObjects();
    throw error;
  }
}

/**
 * Removes a photo: its row and audit entry in one transaction, then its two stored objects (a
 * failed removal is logged; the photo is already gone for everyone). The uploader, an owner or a
 * manager may; not in a closed round.
 * @throws NotFoundError (also for another property's photo), ForbiddenError, ConflictError
 */
export async function removePhoto(propertyId: number, photoId: number, user: { id: number; role: Role }, store: PhotoStore = photoStore()): Promise<void> {
  const row = await db().transaction(async (trx) => {
    const found = (await trx('inspection_photos as p')
      .join('inspection_checks as c', 'c.id', 'p.check_id')
      .join('inspection_rounds as r', 'r.id', 'c.round_id')
      .where({ 'p.id': photoId, 'p.property_id': propertyId })
      .first('p.*', 'r.status as round_status')) as (PhotoRow & { round_status: string }) | undefined;
    if (!found) throw new NotFoundError('photo');
    if (found.uploaded_by !== user.id && !hasRole(user.role, 'manager')) throw new ForbiddenError('Only whoever sent a photo, an owner or a manager can remove it.');
    if (found.round_status === 'closed') throw new ConflictError('This inspection round is closed. Ask an owner or manager to reopen it to remove photos.');
    await trx('inspection_photos').where({ id: photoId }).delete();
    await recordAudit({ propertyId, userId: user.id, action: 'inspection_photo.delete', entityType: 'inspection_photo', entityId: photoId, detail: { checkId: found.check_id } }, trx);
    return found;
  });
  await Promise.all([store.remove(row.storage_key), store.remove(row.thumbnail_key)]).catch((error: unknown) =>
    console.error(`[gullyline] photo ${photoId} removed, but its stored files were not:`, error),
  );
}

/** A photo (or its thumbnail) of the property. @throws NotFoundError, also for another property's photo */
export async function readPhoto(propertyId: number, photoId: number, thumbnail: boolean, store: PhotoStore = photoStore()): Promise<{ bytes: Uint8Array; contentType: string }> {
  const row = (await db()('inspection_photos').where({ id: photoId, property_id: propertyId }).first()) as PhotoRow | undefined;
  if (!row) throw new NotFoundError('photo');
  const bytes = await store.get(thumbnail ? row.thumbnail_key : row.storage_key);
  if (!bytes) throw new NotFoundError('photo', 'The photo file is missing from storage.');
  return { bytes, contentType: thumbnail ? 'image/jpeg' : row.content_type };
}
