import { Router, type Request } from 'express';
import multer from 'multer';
import { z } from 'zod';
import { stepIdSchema } from '@shared/schema';
import type { AppDeps } from '../deps';
import { ctxOf } from '../auth/context';
import { allow } from '../auth/policy';
import { parseInput } from '../lib/validate';
import { idParam } from '../lib/params';
import { notFound } from '../lib/errors';
import { assertStorableText } from '../middleware/storable-text';
import { MAX_PHOTO_BYTES } from '../services/image-check';
import { PICTURE_SIZES, readPicture, uploadPicture, type PictureSize } from '../services/step-picture.service';

const PictureFields = z.object({ stepId: stepIdSchema });

/** `POST /api/procedures/:id/versions/:versionId/pictures`: one picture for a step of a draft (multipart, field "picture"). */
export function pictureUploadRoute(deps: AppDeps): Router {
  const r = Router();
  // preservePath keeps a sent folder in the name so that it can be refused instead of silently cut off.
  const upload = multer({ storage: multer.memoryStorage(), preservePath: true, limits: { fileSize: MAX_PHOTO_BYTES, files: 1, fields: 5, fieldSize: 1024 } });
  r.post('/:id/versions/:versionId/pictures', allow('procedure.author'), upload.single('picture'), async (req, res) => {
    assertStorableText(req.body, 'The picture');
    const { stepId } = parseInput(PictureFields, req.body ?? {}, 'The picture');
    const ids = { procedureId: idParam(req, 'id', 'That procedure'), versionId: idParam(req, 'versionId', 'That version') };
    res.status(201).json(await uploadPicture(deps, ctxOf(req), ids, { stepId, file: req.file }));
  });
  return r;
}

const sizeOf = (req: Request): PictureSize => {
  const size = req.params.size;
  if (!PICTURE_SIZES.includes(size as PictureSize)) throw notFound('That picture size');
  return size as PictureSize;
};

/**
 * `GET /api/pictures/:id/:size` (full, phone or thumb): drafting members see every picture of the
 * shop, Bench workers those of published or retired versions (or of a version their diagnosis
 * pinned), everyone else gets 404 (readPicture). A stored picture never changes.
 */
export function pictureRoutes(deps: AppDeps): Router {
  const r = Router();
  r.get('/:id/:size', async (req, res) => {
    const picture = await readPicture(deps, ctxOf(req), idParam(req, 'id', 'That picture'), sizeOf(req));
    res.setHeader('Content-Type', picture.contentType);
    // the id names bytes that never change, so the phone and the browser may keep them for good
    res.setHeader('Cache-Control', 'private, max-age=31536000, immutable');
    res.setHeader('X-Content-Type-Options', 'nosniff');
    res.send(picture.body);
  });
  return r;
}
