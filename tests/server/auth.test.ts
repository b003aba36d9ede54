import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import request from 'supertest';
import { startTestApp, Client, signInAs, expectEnvelope, DEMO_PASSWORD, type TestEnv } from './harness';
import { User } from '../../server/models';
import { createApp } from '../../server/app';

let env: TestEnv;
beforeAll(async () => { env = await startTestApp(); });
afterAll(async () => { await env.close(); });

const cookieOf = (res: request.Response) =>
  ([] as string[]).concat(res.headers['set-cookie'] ?? []).find((c) => c.startsWith('sw.sid='))?.split(';')[0];

describe('signing in and out', () => {
  it('answers health with the database up', async () => {
    const res = await request(env.app).get('/api/health').expect(200);
    // no DATABASE_REPLICA_URL here: Debrief reads the primary
    expect(res.body).toEqual({ ok: true, db: 'up', replica: { state: 'none', lagSeconds: null, debriefReadsFrom: 'primary' } });
  });

  it('when a demo user signs in, the session cookie changes and /me names their shop and roles', async () => {
    const c = new Client(env.app);
    const csrfRes = await c.agent.get('/api/auth/csrf').expect(200);
    const before = cookieOf(csrfRes);
    expect(before).toBeDefined();
    const login = await c.agent.post('/api/auth/login').set('X-CSRF-Token', csrfRes.body.token)
      .send({ email: 'tech@larkspur.test', password: DEMO_PASSWORD }).expect(200);
    const after = cookieOf(login);
    expect(after).toBeDefined();
    expect(after).not.toEqual(before);
    const me = await c.get('/api/auth/me').expect(200);
    expect(me.body.user.email).toBe('tech@larkspur.test');
    expect(me.body.shops).toEqual([expect.objectContaining({ name: 'Larkspur Lane Powersports', roles: ['technician'] })]);
  });

  it('the session question answers 200 with no user before sign-in, and the person after it', async () => {
    const anonymous = await request(env.app).get('/api/auth/session').expect(200);
    expect(anonymous.body).toEqual({ user: null });
    const c = await signInAs(env.app, 'tech');
    const me = await c.get('/api/auth/session').expect(200);
    expect(me.body.user.email).toBe('tech@larkspur.test');
    expect(me.body.currentShopId).toEqual(expect.any(String));
  });

  it('after sign-out the old session cookie is refused', async () => {
    const c = await signInAs(env.app, 'lead');
    const me = await c.get('/api/auth/me').expect(200);
    expect(me.body.user.email).toBe('lead@larkspur.test');
    const jar = c.agent.jar.getCookie('sw.sid', { domain: '127.0.0.1', path: '/', secure: false, script: false });
    const oldCookie = `sw.sid=${jar?.value}`;
    await c.post('/api/auth/logout').expect(204);
    const replay = await request(env.app).get('/api/auth/me').set('Cookie', oldCookie).expect(401);
    expect(expectEnvelope(replay.body).code).toBe('unauthenticated');
  });

  it('a wrong password and an unknown user get the same answer', async () => {
    const a = await new Client(env.app).signIn('tech@larkspur.test', 'not-the-password');
    const b = await new Client(env.app).signIn('nobody@larkspur.test', 'not-the-password');
    expect(a.status).toBe(401);
    expect(b.status).toBe(401);
    const ea = expectEnvelope(a.body);
    const eb = expectEnvelope(b.body);
    expect({ code: ea.code, message: ea.message }).toEqual({ code: eb.code, message: eb.message });
  });

  it('a sign-in form with a malformed e-mail gets 400 with a field issue', async () => {
    const res = await new Client(env.app).signIn('not-an-email', 'x');
    expect(res.status).toBe(400);
    expect(expectEnvelope(res.body).issues).toEqual([expect.objectContaining({ path: 'email' })]);
  });

  it('a write without the CSRF token answers 403', async () => {
    const c = await signInAs(env.app, 'admin');
    const res = await c.agent.post('/api/vehicles').send({ label: 'X-1' }).expect(403);
    expect(expectEnvelope(res.body).code).toBe('csrf');
    const stale = await c.agent.post('/api/vehicles').set('X-CSRF-Token', 'forged').send({ label: 'X-1' }).expect(403);
    expect(expectEnvelope(stale.body).code).toBe('csrf');
  });

  it('a body that is not JSON gets a clear 400 without a stack trace', async () => {
    const c = await signInAs(env.app, 'admin');
    const res = await c.agent.post('/api/vehicles').set('X-CSRF-Token', c.csrf).set('Content-Type', 'application/json').send('{"label":');
    expect(res.status).toBe(400);
    expect(expectEnvelope(res.body).code).toBe('invalid_json');
  });

  it('every answer carries a strict Content-Security-Policy without inline scripts or styles', async () => {
    const res = await request(env.app).get('/api/health');
    const csp = String(res.headers['content-security-policy']);
    expect(csp).toContain("default-src 'self'");
    expect(csp).toContain("script-src 'self'");
    expect(csp).toContain("frame-ancestors 'none'");
    expect(csp).not.toContain('unsafe-inline');
    expect(csp).not.toContain('unsafe-eval');
    expect(res.headers['x-powered-by']).toBeUndefined();
  });

  it('the session cookie is HttpOnly and SameSite', async () => {
    const res = await new Client(env.app).agent.get('/api/auth/csrf');
    const cookie = ([] as string[]).concat(res.headers['set-cookie'] ?? []).find((c) => c.startsWith('sw.sid='))!;
    expect(cookie).toMatch(/HttpOnly/i);
    expect(cookie).toMatch(/SameSite=Lax/i);
  });

  it('passwords are stored as bcrypt hashes with cost 12', async () => {
    const u = await User.findOne({ where: { email: 'tech@larkspur.test' } });
    expect(u!.passwordHash).toMatch(/^\$2[aby]\$12\$/);
  });
});

describe('the sign-in rate limit', () => {
  // supertest connects from loopback, which the app trusts as a proxy: X-Forwarded-For names
  // the address each attempt comes from
  const from = (app: TestEnv['app'], ip: string) => {
    const c = new Client(app);
    return { signIn: async (email: string, password: string) => {
      const csrf = (await c.agent.get('/api/auth/csrf').set('X-Forwarded-For', ip)).body as { token: string };
      return c.agent.post('/api/auth/login').set('X-Forwarded-For', ip).set('X-CSRF-Token', csrf.token).send({ email, password });
    } };
  };

  it('refuses an address after too many failed sign-ins for an account, on every app server', async () => {
    const limited = await startTestApp({ LOGIN_RATE_LIMIT: '3' });
    try {
      const attacker = from(limited.app, '203.0.113.7');
      const statuses: number[] = [];
      for (let i = 0; i < 3; i++) statuses.push((await attacker.signIn('tech@larkspur.test', 'wrong-password')).status);
      expect(statuses).toEqual([401, 401, 401]);
      const refused = await attacker.signIn('tech@larkspur.test', DEMO_PASSWORD); // even the right password waits
      expect(refused.status).toBe(429);
      expect(expectEnvelope(refused.body).message).toMatch(/Wait \d+ minutes?/);
      // the count lives in PostgreSQL: a second app server on the same database (no shared memory) refuses too
      const second = createApp(limited.runtime.deps);
      expect((await from(second, '203.0.113.7').signIn('tech@larkspur.test', 'wrong-password')).status).toBe(429);
      // another address, or another account from the same address, is not held back
      expect((await from(limited.app, '198.51.100.4').signIn('tech@larkspur.test', DEMO_PASSWORD)).status).toBe(200);
      expect((await attacker.signIn('lead@larkspur.test', DEMO_PASSWORD)).status).toBe(200);
    } finally {
      await limited.close();
    }
  });

  it('a successful sign-in clears the failures, so a shop sharing one address is not locked out by its staff', async () => {
    const limited = await startTestApp({ LOGIN_RATE_LIMIT: '3' });
    try {
      const shop = from(limited.app, '192.0.2.10');
      for (let round = 0; round < 3; round++) {
        expect((await shop.signIn('trainer@larkspur.test', 'typo-password')).status).toBe(401);
        expect((await shop.signIn('trainer@larkspur.test', 'typo-password')).status).toBe(401);
        expect((await shop.signIn('trainer@larkspur.test', DEMO_PASSWORD)).status).toBe(200);
      }
    } finally {
      await limited.close();
    }
  });
});
