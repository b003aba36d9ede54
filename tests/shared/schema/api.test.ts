import { describe, expect, it } from 'vitest';
import { errorEnvelopeSchema, issuesFromZod, lintProcedureBodySchema, parseReadingBodySchema } from '@shared/schema';
import { DEMO_PROCEDURES } from '../../../content';

describe('API input schemas', () => {
  it('POST /api/procedures/lint accepts { document } with a procedure document', () => {
    const body = { document: JSON.parse(JSON.stringify(DEMO_PROCEDURES[0]!.document)) };
    expect(lintProcedureBodySchema.safeParse(body).success).toBe(true);
  });

  it('POST /api/procedures/lint refuses a body without a document, naming the field', () => {
    const r = lintProcedureBodySchema.safeParse({});
    expect(r.success).toBe(false);
    expect(issuesFromZod(r.error!.issues)[0]!.path).toBe('document');
  });

  it('POST /api/readings/parse accepts { text, quantity, unit } and refuses an unknown quantity', () => {
    expect(parseReadingBodySchema.safeParse({ text: '4K7', quantity: 'resistance', unit: 'kΩ' }).success).toBe(true);
    expect(parseReadingBodySchema.safeParse({ text: '4K7', quantity: 'impedance' }).success).toBe(false);
    expect(parseReadingBodySchema.safeParse({ text: 'x'.repeat(65), quantity: 'resistance' }).success).toBe(false);
  });

  it('the error envelope is { error: { code, message, issues?, requestId } }', () => {
    const ok = { error: { code: 'validation', message: 'Check the fields.', issues: [{ path: 'steps.0.unit', message: 'Choose a unit.' }], requestId: 'r-1' } };
    expect(errorEnvelopeSchema.parse(ok)).toEqual(ok);
    expect(errorEnvelopeSchema.safeParse({ error: { code: 'x', message: 'y' } }).success).toBe(false);
  });

  it('turns nested zod issue paths into dotted paths', () => {
    expect(issuesFromZod([{ path: ['steps', 3, 'bands', 0, 'next'], message: 'm' }])).toEqual([{ path: 'steps.3.bands.0.next', message: 'm' }]);
  });
});
