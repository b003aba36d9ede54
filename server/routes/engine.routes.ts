import { Router } from 'express';
import { lintProcedureBodySchema, parseReadingBodySchema } from '@shared/schema/api';
import { lintProcedure } from '@shared/engine';
import { parseReading, formatReading } from '@shared/measure';
import { parseInput } from '../lib/validate';
import { requireUser } from '../auth/context';

/**
 * The engine over HTTP for any signed-in member: the soundness check of a document and the
 * reading parser. Pure computations; nothing is stored.
 */
export function engineRoutes(): Router {
  const r = Router();
  r.post('/procedures/lint', requireUser, (req, res) => {
    const { document } = parseInput(lintProcedureBodySchema, req.body, 'The procedure document');
    res.json(lintProcedure(document));
  });
  r.post('/readings/parse', requireUser, (req, res) => {
    const { text, quantity, unit } = parseInput(parseReadingBodySchema, req.body, 'The reading');
    const result = parseReading(text, quantity, unit);
    if (!result.ok) {
      res.json({ ok: false, error: result.error });
      return;
    }
    const reading = result.reading;
    res.json({
      ok: true,
      value: reading.value,
      quantity: reading.quantity,
      significantDigits: reading.significantDigits,
      understood: reading.understood,
      display: formatReading(reading, unit ? { unit } : {}),
    });
  });
  return r;
}
