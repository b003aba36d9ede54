import { Router } from 'express';
import multer from 'multer';
import { z } from 'zod';
import type { AppDeps } from '../deps';
import { ctxOf } from '../auth/context';
import { allow, allowDiagnosisReading } from '../auth/policy';
import { parseInput } from '../lib/validate';
import { idParam } from '../lib/params';
import { assertStorableText } from '../middleware/storable-text';
import { addPhoto, MAX_PHOTO_BYTES, readPhoto } from '../services/attachment.service';

const PhotoFields = z.object({
  id: z.string().uuid('Use the id the app generated (a UUID)'),
  diagnosisId: z.string().uuid('Name the diagnosis the photo belongs to'),
  stepId: z.string().max(64).optional(),
});

/** Photos of a diagnosis: held in memory up to the limit, checked by their bytes, then stored in S3. */
export function attachmentRoutes(deps: AppDeps): Router {
  const r = Router();
  // preservePath keeps a sent folder in the name so that it can be refused instead of silently cut off.
  const upload = multer({ storage: multer.memoryStorage(), preservePath: true, limits: { fileSize: MAX_PHOTO_BYTES, files: 2, fields: 10, fieldSize: 1024 } });
  r.post('/', allow('diagnosis.work'), upload.fields([{ name: 'photo', maxCount: 1 }, { name: 'thumb', maxCount: 1 }]), async (req, res) => {
    assertStorableText(req.body, 'The photo');
    const fields = parseInput(PhotoFields, req.body, 'The photo');
    const files = (req.files ?? {}) as Record<string, Express.Multer.File[] | undefined>;
    const out = await addPhoto(deps, ctxOf(req), {
      id: fields.id, diagnosisId: fields.diagnosisId, stepId: fields.stepId ?? null, photo: files.photo?.[0], thumb: files.thumb?.[0],
    });
    res.status(out.created ? 201 : 200).json(out.attachment);
  });
  const send = (thumb: boolean) => async (req: Parameters<Parameters<typeof r.get>[1]>[0], res: Parameters<Parameters<typeof r.get>[1]>[1]) => {
    const photo = await readPhoto(deps, ctxOf(req), idParam(req, 'id', 'That photo'), thumb);
    res.setHeader('Content-Type', photo.contentType);
    res.setHeader('Cache-Control', 'private, max-age=86400');
    res.setHeader('X-Content-Type-Options', 'nosniff');
    res.send(photo.body);
  };
  r.get('/:id', allowDiagnosisReading, send(false));
  r.get('/:id/thumb', allowDiagnosisReading, send(true));
  return r;
}
