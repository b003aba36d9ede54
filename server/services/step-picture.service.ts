import { createHash, randomUUID } from 'node:crypto';
import { QueryTypes, type Transaction } from 'sequelize';
import sharp from 'sharp';
import type { ProcedureDocument } from '@shared/schema';
import type { AppDeps } from '../deps';
import type { ShopContext } from '../auth/context';
import { can } from '../auth/policy';
import { AppError, badRequest, notFound } from '../lib/errors';
import { checkName, IMAGE_TYPES, imageType } from './image-check';
import { expectStatus, findProcedure, findVersion } from './procedure-common';

/**
 * Reference pictures on procedure steps. The upload is checked by its bytes (the same check as
 * Bench photos), decoded by sharp (a file that only looks like a picture fails here), and stored
 * three times: the original, a thumbnail for the editor and a phone-sized rendition for the Bench.
 * A stored picture never changes; the version's document names it with its caption.
 */

/** Longest side of the editor's thumbnail and of the phone's rendition, in pixels. */
export const THUMB_PX = 320;
export const PHONE_PX = 1280;
/** A decoded picture larger than this (about a 40-megapixel camera) is refused before it fills memory. */
const MAX_PIXELS = 40_000_000;

export const PICTURE_SIZES = ['full', 'phone', 'thumb'] as const;
export type PictureSize = (typeof PICTURE_SIZES)[number];

export interface PictureDto { id: string; contentType: string; byteSize: number; phoneBytes: number; width: number; height: number }

/** A picture checked and rendered in memory, not yet stored. */
export interface PreparedPicture {
  mime: string; original: Buffer; thumb: Buffer; phone: Buffer; width: number; height: number; sha256: string; name: string;
}

/** Checks a picture by its bytes and makes its thumbnail and phone rendition; nothing is stored. */
export async function preparePicture(bytes: Buffer, name: string, field = 'picture'): Promise<PreparedPicture> {
  checkName(name, field);
  const mime = await imageType(bytes, field);
  try {
    // rotate() applies the camera's orientation; sharp writes no metadata (GPS and all) unless asked.
    const image = () => sharp(bytes, { limitInputPixels: MAX_PIXELS, failOn: 'error' }).rotate();
    const meta = await image().metadata();
    const [thumb, phone] = await Promise.all([
      image().resize(THUMB_PX, THUMB_PX, { fit: 'inside', withoutEnlargement: true }).webp({ quality: 72 }).toBuffer(),
      image().resize(PHONE_PX, PHONE_PX, { fit: 'inside', withoutEnlargement: true }).webp({ quality: 78 }).toBuffer(),
    ]);
    const turned = (meta.orientation ?? 1) >= 5;
    return {
      mime, original: bytes, thumb, phone, sha256: createHash('sha256').update(bytes).digest('hex'), name: name.slice(0, 200),
      width: (turned ? meta.height : meta.width) ?? 0, height: (turned ? meta.width : meta.height) ?? 0,
    };
  } catch {
    throw new AppError(415, 'not_an_image', `The ${field} could not be read as a picture (it is damaged, or larger than 40 megapixels). Save it again as JPEG, PNG or WebP and upload that.`);
  }
}

interface Keys { objectKey: string; thumbKey: string; phoneKey: string }

function keysOf(shopId: string, id: string, p: PreparedPicture): Keys {
  const base = `shops/${shopId}/pictures/${id}`;
  return { objectKey: `${base}.${IMAGE_TYPES[p.mime]}`, thumbKey: `${base}-thumb.webp`, phoneKey: `${base}-phone.webp` };
}

/** Puts the three objects; if one fails, those already written are removed again. */
async function putObjects(deps: AppDeps, shopId: string, id: string, p: PreparedPicture): Promise<Keys> {
  const keys = keysOf(shopId, id, p);
  const puts = await Promise.allSettled([
    deps.store.put(keys.objectKey, p.original, p.mime), deps.store.put(keys.thumbKey, p.thumb, 'image/webp'), deps.store.put(keys.phoneKey, p.phone, 'image/webp'),
  ]);
  const failed = puts.find((r) => r.status === 'rejected');
  if (failed) {
    await removeObjects(deps, keys);
    throw (failed as PromiseRejectedResult).reason;
  }
  return keys;
}

async function removeObjects(deps: AppDeps, keys: Keys): Promise<void> {
  await Promise.allSettled([deps.store.remove(keys.objectKey), deps.store.remove(keys.thumbKey), deps.store.remove(keys.phoneKey)]);
}

/** Removes the objects of pictures whose rows were rolled back (a transaction that failed after storePictures). */
export async function forgetPictures(deps: AppDeps, shopId: string, pictures: { id: string; picture: PreparedPicture }[]): Promise<void> {
  await Promise.all(pictures.map(({ id, picture }) => removeObjects(deps, keysOf(shopId, id, picture))));
}

interface PictureOwner { shopId: string; procedureId: string; versionId: string; stepId: string; userId: string }

const INSERT_SQL = `INSERT INTO step_pictures (id, shop_id, procedure_id, version_id, step_id, object_key, thumb_key, phone_key, content_type, byte_size, phone_bytes, width, height, sha256, original_name, created_by)
  VALUES (:id, :shopId, :procedureId, :versionId, :stepId, :objectKey, :thumbKey, :phoneKey, :mime, :size, :phoneBytes, :width, :height, :sha256, :name, :userId)`;

/**
 * Stores prepared pictures: objects first, then the rows (in `transaction` when given). If a row
 * cannot be written every object is removed again, so a refusal leaves nothing in the bucket.
 */
export async function storePictures(
  deps: AppDeps, owner: Omit<PictureOwner, 'stepId'>, pictures: { id: string; stepId: string; picture: PreparedPicture }[], transaction?: Transaction,
): Promise<PictureDto[]> {
  const stored: Keys[] = [];
  try {
    for (const { id, stepId, picture } of pictures) {
      const keys = await putObjects(deps, owner.shopId, id, picture);
      stored.push(keys);
      await deps.sequelize.query(INSERT_SQL, {
        replacements: {
          id, ...owner, stepId, ...keys, mime: picture.mime, size: picture.original.length, phoneBytes: picture.phone.length,
          width: picture.width, height: picture.height, sha256: picture.sha256, name: picture.name,
        },
        ...(transaction ? { transaction } : {}),
      });
    }
  } catch (err) {
    await Promise.all(stored.map((k) => removeObjects(deps, k)));
    throw err;
  }
  return pictures.map(({ id, picture: p }) => ({ id, contentType: p.mime, byteSize: p.original.length, phoneBytes: p.phone.length, width: p.width, height: p.height }));
}

/** An author adds a picture to a step of a draft; a version in review, published or retired never gains one (409). */
export async function uploadPicture(
  deps: AppDeps, ctx: ShopContext, ids: { procedureId: string; versionId: string }, input: { stepId: string; file?: { originalname: string; buffer: Buffer } | undefined },
): Promise<PictureDto> {
  if (!input.file) throw badRequest('Attach the picture in the "picture" field.', [{ path: 'picture', message: 'Required' }]);
  await findProcedure(ctx, ids.procedureId);
  const v = await findVersion(ctx, ids.procedureId, ids.versionId);
  expectStatus(v, ['draft'], 'given new pictures (a numbered version never changes; start a new draft from it)');
  const picture = await preparePicture(input.file.buffer, input.file.originalname);
  const id = randomUUID();
  const [dto] = await storePictures(deps, { shopId: ctx.shopId, procedureId: ids.procedureId, versionId: v.id, userId: ctx.userId }, [{ id, stepId: input.stepId, picture }]);
  return dto!;
}

interface PictureRow { id: string; object_key: string; thumb_key: string; phone_key: string; content_type: string; original_name: string }

/** Stored pictures of the caller's shop by id; another shop's ids are simply not there. */
export async function picturesByIds(deps: AppDeps, ctx: ShopContext, ids: readonly string[], transaction?: Transaction): Promise<PictureRow[]> {
  if (ids.length === 0) return [];
  return deps.sequelize.query<PictureRow>(
    'SELECT id, object_key, thumb_key, phone_key, content_type, original_name FROM step_pictures WHERE shop_id = :shopId AND id IN (:ids)',
    { replacements: { shopId: ctx.shopId, ids: [...new Set(ids)] }, type: QueryTypes.SELECT, ...(transaction ? { transaction } : {}) },
  );
}

/** A jsonb document that `@>` matches when some step of a version names the picture `:id`. */
const NAMES_PICTURE = "jsonb_build_object('steps', jsonb_build_array(jsonb_build_object('pictures', jsonb_build_array(jsonb_build_object('id', CAST(:id AS text))))))";

/**
 * Who may see a picture, in one query: members who open drafts ('procedure.draft') see every
 * picture of the shop (a fresh upload is named by no version yet); Bench workers see a picture
 * that a published or retired version of the shop names, or a version one of their own diagnoses
 * pinned. Everyone else, and another shop's picture, get the 404.
 */
const READ_SQL = `SELECT p.object_key, p.thumb_key, p.phone_key FROM step_pictures p
  WHERE p.id = :id AND (
    (:drafts AND p.shop_id = :shopId)
    OR (:bench AND p.shop_id = :shopId AND EXISTS (SELECT 1 FROM procedure_versions v
          WHERE v.shop_id = :shopId AND v.status IN ('published', 'retired') AND v.document @> ${NAMES_PICTURE}))
    OR (:bench AND EXISTS (SELECT 1 FROM diagnoses d JOIN procedure_versions v ON v.id = d.procedure_version_id
          WHERE d.shop_id = :shopId AND d.technician_id = :userId AND v.document @> ${NAMES_PICTURE})))`;

/** The bytes of one size of a picture, for those who may see it (READ_SQL); anyone else gets a 404. */
export async function readPicture(deps: AppDeps, ctx: ShopContext, id: string, size: PictureSize): Promise<{ body: Buffer; contentType: string }> {
  const drafts = can(ctx, 'procedure.draft');
  const bench = can(ctx, 'diagnosis.work');
  if (!drafts && !bench) throw notFound('That picture');
  const [row] = await deps.sequelize.query<Pick<PictureRow, 'object_key' | 'thumb_key' | 'phone_key'>>(READ_SQL, {
    replacements: { id, shopId: ctx.shopId, userId: ctx.userId, drafts, bench }, type: QueryTypes.SELECT,
  });
  if (!row) throw notFound('That picture');
  return deps.store.get(size === 'full' ? row.object_key : size === 'phone' ? row.phone_key : row.thumb_key);
}

/** Every picture a document names, step by step, in order. */
export function pictureRefs(doc: ProcedureDocument): { stepIndex: number; index: number; id: string }[] {
  return doc.steps.flatMap((s, stepIndex) => (s.pictures ?? []).map((p, index) => ({ stepIndex, index, id: p.id })));
}

/** A draft may only name pictures stored for this shop: a 422 per unknown one, naming the step. */
export async function checkPictureRefs(deps: AppDeps, ctx: ShopContext, doc: ProcedureDocument, transaction?: Transaction): Promise<void> {
  const refs = pictureRefs(doc);
  if (refs.length === 0) return;
  const known = new Set((await picturesByIds(deps, ctx, refs.map((r) => r.id), transaction)).map((r) => r.id));
  const missing = refs.filter((r) => !known.has(r.id));
  if (missing.length > 0) {
    throw new AppError(422, 'unknown_picture', 'The draft names a picture this shop has not stored. Remove it from the step and add the picture again; nothing was saved.',
      missing.map((m) => ({ path: `steps.${m.stepIndex}.pictures.${m.index}`, message: `No stored picture has the id ${m.id}` })));
  }
}

/** A picture named by no version is kept this long after upload, so an author's upload not yet saved into the draft is not swept. */
export const UNNAMED_PICTURE_GRACE_HOURS = 24;

/**
 * Housekeeping: removes the pictures that no version of their shop names (any status: a draft,
 * one in review, published or retired) and that are older than the grace period, rows first in
 * one statement (so no row ever points at removed bytes), then their objects. Returns how many.
 * A picture removed from a draft and put back after the sweep must be added again (the save says so).
 */
export async function sweepUnnamedPictures(deps: AppDeps, graceHours = UNNAMED_PICTURE_GRACE_HOURS): Promise<number> {
  const gone = await deps.sequelize.query<{ object_key: string; thumb_key: string; phone_key: string }>(
    `WITH old AS (SELECT id, shop_id FROM step_pictures WHERE created_at < now() - make_interval(secs => 3600 * CAST(:graceHours AS float8))),
     named AS (
       SELECT DISTINCT v.shop_id, pic->>'id' AS id
         FROM procedure_versions v
        CROSS JOIN LATERAL jsonb_array_elements(v.document->'steps') step
        CROSS JOIN LATERAL jsonb_array_elements(CASE WHEN jsonb_typeof(step->'pictures') = 'array' THEN step->'pictures' ELSE '[]'::jsonb END) pic
        WHERE v.shop_id IN (SELECT shop_id FROM old))
     DELETE FROM step_pictures p USING old
      WHERE p.id = old.id AND NOT EXISTS (SELECT 1 FROM named n WHERE n.shop_id = p.shop_id AND n.id = p.id::text)
     RETURNING p.object_key, p.thumb_key, p.phone_key`,
    { replacements: { graceHours }, type: QueryTypes.SELECT },
  );
  await Promise.all(gone.map((k) => removeObjects(deps, { objectKey: k.object_key, thumbKey: k.thumb_key, phoneKey: k.phone_key })));
  return gone.length;
}
