import { afterEach, describe, expect, it, vi } from 'vitest';
import { api, ApiError } from '../../src/lib/api-client';

// The envelope as server/middleware/error-handler.ts writes it for an unexpected failure.
const internal = { error: { code: 'internal', message: 'Something went wrong on our side. Try again; if it keeps happening, give your admin the request id.', requestId: 'req-7f3a' } };
const answer = (status: number, body: unknown) => vi.fn(async () => new Response(JSON.stringify(body), { status, headers: { 'Content-Type': 'application/json' } }));

afterEach(() => vi.unstubAllGlobals());

describe('errors a person can act on', () => {
  it('a 500 shows the request id it asks the person to quote', async () => {
    vi.stubGlobal('fetch', answer(500, internal));
    const err = await api.get('/api/bench/procedures').catch((e: unknown) => e);
    expect(err).toBeInstanceOf(ApiError);
    expect((err as ApiError).requestId).toBe('req-7f3a');
    expect((err as ApiError).message).toContain('Request id: req-7f3a.');
  });

  it('a 4xx keeps its own message, which already says what to do', async () => {
    vi.stubGlobal('fetch', answer(404, { error: { code: 'not_found', message: 'That machine was not found in this shop.', requestId: 'req-1' } }));
    const err = (await api.get('/api/vehicles/x').catch((e: unknown) => e)) as ApiError;
    expect(err.message).toBe('That machine was not found in this shop.');
  });
});
