import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { createServer, type Server, type Socket } from 'node:net';
import type { Express } from 'express';
import { createApp } from '../../server/app';
import { createSequelize, DB_TIMEOUTS } from '../../server/db';
import { initModels } from '../../server/models';
import { expectEnvelope, startTestApp, type TestEnv } from './harness';

// A database that accepts connections and then says nothing (a dead host behind a live port, a
// half-open network): the app must still answer, 503 with Retry-After, once its connection
// timeout has passed, instead of holding the request open. (A stopped database refuses at once;
// tests/server/outage.test.ts covers that case under load.)

let env: TestEnv;
let silent: Server;
const sockets = new Set<Socket>();
let app: Express;
let closeSilentApp: () => Promise<void>;

beforeAll(async () => {
  env = await startTestApp();
  silent = createServer((socket) => { sockets.add(socket); socket.on('error', () => undefined); });
  await new Promise<void>((resolve) => silent.listen(0, '127.0.0.1', resolve));
  const port = (silent.address() as { port: number }).port;
  const url = `postgres://sparkwright:x@127.0.0.1:${port}/sparkwright`;
  const sequelize = createSequelize(url);
  app = createApp({ ...env.runtime.deps, sequelize, config: { ...env.runtime.deps.config, DATABASE_URL: url } });
  closeSilentApp = async () => {
    await (app.locals.sessionPool as { end(): Promise<void> }).end().catch(() => undefined);
    await sequelize.close().catch(() => undefined);
  };
});
afterAll(async () => {
  await closeSilentApp();
  initModels(env.runtime.deps.sequelize);
  for (const s of sockets) s.destroy();
  silent.close();
  await env.close();
});

describe('a database that never answers', () => {
  it('a request that needs it answers 503 with the error envelope and Retry-After once the connection timeout passes', async () => {
    const t0 = performance.now();
    const res = await request(app).get('/api/auth/invitations/some-token-that-needs-a-lookup');
    const ms = performance.now() - t0;
    expect(res.status).toBe(503);
    expect(expectEnvelope(res.body).code).toBe('unavailable');
    expect(Number(res.headers['retry-after'])).toBeGreaterThan(0);
    // bounded by the connection timeout, not by the client giving up
    expect(ms).toBeGreaterThanOrEqual(DB_TIMEOUTS.connectMs - 100);
    expect(ms).toBeLessThan(DB_TIMEOUTS.connectMs + 3000);
  }, 20_000);
});
