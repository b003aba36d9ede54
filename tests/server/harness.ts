import request from 'supertest';
import type { Express } from 'express';
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { loadConfig } from '../../server/config';
import { startRuntime, type Runtime } from '../../server/runtime';
import { createApp } from '../../server/app';
import { seedDemo } from '../../server/seeders/demo';
import { Shop, User, Membership } from '../../server/models';
import { hashPassword } from '../../server/lib/passwords';
import type { Role } from '@shared/schema/roles';

export const DEMO_PASSWORD = 'spark-demo-test-pw';

export interface TestEnv {
  app: Express;
  runtime: Runtime;
  /** the local fake SMTP receiver of this test file */
  smtp: NonNullable<Runtime['fakes']['smtp']>;
  close(): Promise<void>;
}

/**
 * A real app over the real PostgreSQL of scripts/test.sh ($DATABASE_URL, migrated), with its own
 * fake SMTP and S3 on loopback. Every table is emptied and the demo shop seeded again, so each
 * test file starts from the same state.
 */
export async function startTestApp(overrides: Record<string, string> = {}): Promise<TestEnv> {
  if (!process.env.DATABASE_URL) throw new Error('DATABASE_URL is not set: run the API tests through `npm test`.');
  const config = loadConfig({
    ...process.env,
    NODE_ENV: 'test',
    PORT: '0',
    SMTP_PORT: '0',
    DEMO_PASSWORD,
    SERVE_CLIENT: '0',
    LOCAL_FAKES: '1',
    DATA_DIR: mkdtempSync(path.join(tmpdir(), 'sw-test-')),
    LOGIN_RATE_LIMIT: '1000',
    DEMO_HISTORY: '0',
    ...overrides,
  });
  const runtime = await startRuntime(config);
  await truncateAll(runtime);
  await seedDemo(runtime.deps);
  const app = createApp(runtime.deps);
  return {
    app,
    runtime,
    smtp: runtime.fakes.smtp!,
    async close() {
      await (app.locals.sessionPool as { end(): Promise<void> }).end();
      await runtime.close();
    },
  };
}

async function truncateAll(runtime: Runtime): Promise<void> {
  const [rows] = await runtime.deps.sequelize.query(
    `SELECT tablename FROM pg_tables WHERE schemaname = 'public' AND tablename <> 'schema_migrations'`,
  );
  const names = (rows as { tablename: string }[]).map((r) => `"${r.tablename}"`).join(', ');
  if (names) await runtime.deps.sequelize.query(`TRUNCATE ${names} RESTART IDENTITY CASCADE`);
}

/** A supertest agent with a cookie jar that signs in and sends the CSRF token on every write. */
export class Client {
  readonly agent: ReturnType<typeof request.agent>;
  csrf = '';
  constructor(app: Express) {
    this.agent = request.agent(app);
  }
  async fetchCsrf(): Promise<string> {
    const res = await this.agent.get('/api/auth/csrf').expect(200);
    this.csrf = (res.body as { token: string }).token;
    return this.csrf;
  }
  async signIn(email: string, password = DEMO_PASSWORD): Promise<request.Response> {
    await this.fetchCsrf();
    const res = await this.agent.post('/api/auth/login').set('X-CSRF-Token', this.csrf).send({ email, password });
    if (res.status === 200) this.csrf = (res.body as { csrfToken: string }).csrfToken;
    return res;
  }
  get(url: string) { return this.agent.get(url); }
  post(url: string, body?: object) { return this.agent.post(url).set('X-CSRF-Token', this.csrf).send(body); }
  put(url: string, body?: object) { return this.agent.put(url).set('X-CSRF-Token', this.csrf).send(body); }
  patch(url: string, body?: object) { return this.agent.patch(url).set('X-CSRF-Token', this.csrf).send(body); }
  delete(url: string) { return this.agent.delete(url).set('X-CSRF-Token', this.csrf); }
}

/** Signs in a demo account (admin, author, lead, tech, trainer) of the demo shop. */
export async function signInAs(app: Express, who: 'admin' | 'author' | 'lead' | 'tech' | 'trainer'): Promise<Client> {
  const c = new Client(app);
  const res = await c.signIn(`${who}@larkspur.test`);
  if (res.status !== 200) throw new Error(`sign-in of ${who} failed: ${res.status} ${JSON.stringify(res.body)}`);
  return c;
}

/**
 * A second, unrelated shop with one member holding the given roles, for cross-shop checks.
 * Returns a signed-in client of that member.
 */
export async function otherShopMember(env: TestEnv, roles: Role[], email = 'other@elsewhere.test'): Promise<Client> {
  const [shop] = await Shop.findOrCreate({ where: { slug: 'other-shop' }, defaults: { slug: 'other-shop', name: 'Other Shop' } });
  const user = await User.create({ email, name: 'Other Member', passwordHash: await hashPassword(DEMO_PASSWORD) });
  await Membership.create({ shopId: shop.id, userId: user.id, roles });
  const c = new Client(env.app);
  const res = await c.signIn(email);
  if (res.status !== 200) throw new Error(`sign-in of ${email} failed: ${res.status}`);
  return c;
}

/** Every error body has the one envelope and never a stack trace. */
export function expectEnvelope(body: unknown): { code: string; message: string; issues?: { path: string; message: string }[] } {
  const b = body as { error?: { code: string; message: string; requestId: string; issues?: { path: string; message: string }[] } };
  if (!b.error || typeof b.error.code !== 'string' || typeof b.error.message !== 'string' || typeof b.error.requestId !== 'string') {
    throw new Error(`not an error envelope: ${JSON.stringify(body)}`);
  }
  if (JSON.stringify(body).match(/\bat .+\.(ts|js):\d+/)) throw new Error('a stack trace reached the client');
  return b.error;
}
