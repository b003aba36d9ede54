import { QueryTypes } from 'sequelize';
import type { AppDeps } from '../deps';
import type { ShopContext } from '../auth/context';
import { AppError, badRequest, notFound } from '../lib/errors';
import { checkName, IMAGE_TYPES, imageType, MAX_PHOTO_BYTES } from './image-check';
import { findReadable } from './diagnosis.service';
import { checkDiagnosis } from '../auth/policy';

export { MAX_PHOTO_BYTES };

export interface UploadedFile { originalname: string; buffer: Buffer; size: number }
export interface AttachmentDto { id: string; diagnosisId: string; stepId: string | null; contentType: string; byteSize: number; originalName: string; hasThumb: boolean }

async function writable(deps: AppDeps, ctx: ShopContext, diagnosisId: string): Promise<void> {
  const [d] = await deps.sequelize.query<{ technician_id: string }>(
    'SELECT technician_id FROM diagnoses WHERE id = :id AND shop_id = :shopId', { replacements: { id: diagnosisId, shopId: ctx.shopId }, type: QueryTypes.SELECT });
  if (!d) throw notFound('That diagnosis');
  checkDiagnosis(ctx, d.technician_id, 'write');
}

const toDto = (r: { id: string; diagnosis_id: string; step_id: string | null; content_type: string; byte_size: number; original_name: string; thumb_key: string | null }): AttachmentDto => ({
  id: r.id, diagnosisId: r.diagnosis_id, stepId: r.step_id, contentType: r.content_type, byteSize: r.byte_size, originalName: r.original_name, hasThumb: r.thumb_key !== null,
});

/**
 * Stores a photo (and the thumbnail the phone made) once per client id: bytes checked first,
 * then the objects, then the row; if the row cannot be written the objects are removed again.
 */
export async function addPhoto(deps: AppDeps, ctx: ShopContext, input: { id: string; diagnosisId: string; stepId: string | null; photo?: UploadedFile | undefined; thumb?: UploadedFile | undefined }): Promise<{ created: boolean; attachment: AttachmentDto }> {
  if (!input.photo) throw badRequest('Attach a photo in the "photo" field.', [{ path: 'photo', message: 'Required' }]);
  checkName(input.photo.originalname);
  if (input.thumb) checkName(input.thumb.originalname);
  await writable(deps, ctx, input.diagnosisId);
  const [existing] = await deps.sequelize.query<Parameters<typeof toDto>[0]>('SELECT * FROM attachments WHERE id = :id', { replacements: { id: input.id }, type: QueryTypes.SELECT });
  if (existing) {
    if (existing.diagnosis_id !== input.diagnosisId) throw new AppError(422, 'id_reused', 'A different photo was already stored with this id. Attach the photo again.');
    return { created: false, attachment: toDto(existing) };
  }
  const mime = await imageType(input.photo.buffer, 'photo');
  const thumbMime = input.thumb ? await imageType(input.thumb.buffer, 'thumbnail') : null;
  const base = `shops/${ctx.shopId}/diagnoses/${input.diagnosisId}/${input.id}`;
  const objectKey = `${base}.${IMAGE_TYPES[mime]}`;
  const thumbKey = thumbMime ? `${base}-thumb.${IMAGE_TYPES[thumbMime]}` : null;
  await deps.store.put(objectKey, input.photo.buffer, mime);
  try {
    if (thumbKey && input.thumb) await deps.store.put(thumbKey, input.thumb.buffer, thumbMime!);
    const [rows] = await deps.sequelize.query(
      `INSERT INTO attachments (id, shop_id, diagnosis_id, step_id, object_key, thumb_key, content_type, byte_size, original_name, created_by)
       VALUES (:id, :shopId, :diagnosisId, :stepId, :objectKey, :thumbKey, :mime, :size, :name, :userId) RETURNING *`,
      { replacements: { id: input.id, shopId: ctx.shopId, diagnosisId: input.diagnosisId, stepId: input.stepId, objectKey, thumbKey, mime, size: input.photo.size, name: input.photo.originalname.slice(0, 200), userId: ctx.userId } });
    return { created: true, attachment: toDto((rows as Parameters<typeof toDto>[0][])[0]!) };
  } catch (err) {
    await Promise.allSettled([deps.store.remove(objectKey), ...(thumbKey ? [deps.store.remove(thumbKey)] : [])]);
    throw err;
  }
}

/** The bytes of a photo or its thumbnail, for someone who may read the diagnosis. */
export async function readPhoto(deps: AppDeps, ctx: ShopContext, id: string, thumb: boolean): Promise<{ body: Buffer; contentType: string }> {
  const [a] = await deps.sequelize.query<{ diagnosis_id: string; object_key: string; thumb_key: string | null }>(
    'SELECT diagnosis_id, object_key, thumb_key FROM attachments WHERE id = :id AND shop_id = :shopId', { replacements: { id, shopId: ctx.shopId }, type: QueryTypes.SELECT });
  if (!a) throw notFound('That photo');
  await findReadable(deps, ctx, a.diagnosis_id);
  return deps.store.get(thumb && a.thumb_key ? a.thumb_key : a.object_key);
}
