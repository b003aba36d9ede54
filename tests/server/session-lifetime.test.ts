import { afterAll, afterEach, beforeAll, describe, expect, it, vi } from 'vitest';
import pg from 'pg';
import { startTestApp, signInAs, expectEnvelope, Client, DEMO_PASSWORD, type TestEnv } from './harness';
import { Membership, Shop, User } from '../../server/models';
import { hashPassword } from '../../server/lib/passwords';

// The idle and absolute lifetimes are the defaults of server/config.ts (stated in README.md).
const IDLE_MIN = 120;
const MAX_HOURS = 12;
const MINUTE = 60_000;

let env: TestEnv;
let other: pg.Client;
let shopId: string;
beforeAll(async () => {
  env = await startTestApp();
  other = new pg.Client({ connectionString: process.env.DATABASE_URL });
  await other.connect();
  shopId = (await Shop.findOne({ where: { slug: 'larkspur-lane' } }))!.id;
});
afterAll(async () => {
  await other.end();
  await env.close();
});
afterEach(() => { vi.useRealTimers(); });

/** Only Date is faked: the sockets, timers and PostgreSQL keep real time, the session clocks do not. */
function clockAt(now: number): (minutes: number) => void {
  vi.useFakeTimers({ toFake: ['Date'], now });
  let t = now;
  return (minutes) => { t += minutes * MINUTE; vi.setSystemTime(t); };
}

async function member(email: string, roles: ('technician' | 'admin')[] = ['technician']): Promise<{ c: Client; membershipId: string; userId: string }> {
  const user = await User.create({ email, name: 'Session Person', passwordHash: await hashPassword(DEMO_PASSWORD) });
  const m = await Membership.create({ shopId, userId: user.id, roles });
  const c = new Client(env.app);
  expect((await c.signIn(email)).status).toBe(200);
  return { c, membershipId: m.id, userId: user.id };
}

describe('session lifetime', () => {
  it(`a session unused for ${IDLE_MIN} minutes ends, and says why`, async () => {
    const later = clockAt(Date.now());
    const tech = await signInAs(env.app, 'tech');
    later(IDLE_MIN - 5);
    await tech.get('/api/vehicles').expect(200); // still within: and this use is recorded
    later(IDLE_MIN - 5);
    await tech.get('/api/vehicles').expect(200); // idle counts from the last use, not from sign-in
    later(IDLE_MIN + 6);
    const res = await tech.get('/api/vehicles');
    expect(res.status).toBe(401);
    expect(expectEnvelope(res.body)).toMatchObject({ code: 'session_expired', message: expect.stringMatching(/120 minutes without use.*Sign in again/) });
    expect((await tech.get('/api/auth/me')).status).toBe(401); // the session is gone, not just refused once
  });

  it(`a session ends ${MAX_HOURS} hours after sign-in however busy it is`, async () => {
    const later = clockAt(Date.now());
    const tech = await signInAs(env.app, 'tech');
    for (let used = 0; used + 60 < MAX_HOURS * 60; used += 60) {
      later(60);
      expect((await tech.get('/api/vehicles')).status, `after ${used + 60} minutes`).toBe(200);
    }
    later(61);
    const res = await tech.get('/api/vehicles');
    expect(res.status).toBe(401);
    expect(expectEnvelope(res.body).message).toMatch(/12 hours after signing in/);
  });

  it('signing in again starts both clocks afresh', async () => {
    const later = clockAt(Date.now());
    const tech = await signInAs(env.app, 'tech');
    later(IDLE_MIN + 1);
    expect((await tech.get('/api/vehicles')).status).toBe(401);
    expect((await tech.signIn('tech@larkspur.test')).status).toBe(200);
    await tech.get('/api/vehicles').expect(200);
  });
});

describe('disabling a member', () => {
  it('ends their sessions in the shop at once, keeps them out until enabled, and keeps their roles', async () => {
    const admin = await signInAs(env.app, 'admin');
    const { c: phone, membershipId } = await member('disabled.phone@larkspur.test');
    const desk = new Client(env.app);
    expect((await desk.signIn('disabled.phone@larkspur.test')).status).toBe(200);
    await phone.get('/api/vehicles').expect(200); // both sessions now remembered by this server
    await desk.get('/api/vehicles').expect(200);

    const res = await admin.post(`/api/shop/members/${membershipId}/disable`).expect(200);
    expect(res.body).toMatchObject({ id: membershipId, disabled: true });
    for (const c of [phone, desk]) expect((await c.get('/api/vehicles')).status).toBe(401); // at once, not after the 30 s cache
    const { rows } = await other.query(`SELECT count(*)::int AS n FROM "session" WHERE sess->'passport'->'user'->>'email' = $1`, ['disabled.phone@larkspur.test']);
    expect(rows[0].n).toBe(0);

    // signing in again works, but the shop stays closed until an admin enables the member
    const again = new Client(env.app);
    const me = await again.signIn('disabled.phone@larkspur.test');
    expect(me.status).toBe(200);
    expect(me.body.shops).toEqual([]);
    expect((await again.post('/api/auth/shop', { shopId })).status).toBe(404);
    const members = await admin.get('/api/shop/members').expect(200);
    expect(members.body.find((m: { id: string }) => m.id === membershipId)).toMatchObject({ disabled: true, roles: ['technician'] });

    await admin.post(`/api/shop/members/${membershipId}/enable`).expect(200);
    const back = new Client(env.app);
    expect((await back.signIn('disabled.phone@larkspur.test')).body.currentShopId).toBe(shopId);
    await back.get('/api/vehicles').expect(200);
  });

  it('a member disabled on another app server is refused here at once (through the cache bus)', async () => {
    const { c, membershipId, userId } = await member('disabled.elsewhere@larkspur.test');
    await c.get('/api/vehicles').expect(200); // remembered here for 30 s
    // the other server's disable: the row, the sessions, and the two notices it sends
    await other.query('UPDATE memberships SET disabled_at = now() WHERE id = $1', [membershipId]);
    await other.query(`DELETE FROM "session" WHERE sess->'passport'->'user'->>'id' = $1`, [userId]);
    await other.query('SELECT pg_notify($1, $2), pg_notify($1, $3)', ['sparkwright_cache', `membership:${userId}:${shopId}`, `user-sessions:${userId}`]);
    let status = 0;
    for (let i = 0; i < 30 && status !== 401; i++) {
      status = (await c.get('/api/vehicles')).status;
      if (status !== 401) await new Promise((r) => setTimeout(r, 100));
    }
    expect(status).toBe(401);
  });

  it('an admin cannot disable themselves (so a shop always keeps an enabled admin); a foreign id is 404', async () => {
    const admin = await signInAs(env.app, 'admin');
    const members = await admin.get('/api/shop/members').expect(200);
    const mine = members.body.find((m: { email: string }) => m.email === 'admin@larkspur.test');
    const self = await admin.post(`/api/shop/members/${mine.id}/disable`);
    expect(self.status).toBe(409);
    expect(expectEnvelope(self.body).code).toBe('disable_self');
    const { c: second } = await member('second.admin@larkspur.test', ['admin']);
    await second.post(`/api/shop/members/${mine.id}/disable`).expect(200); // two admins: one may disable the other
    expect((await admin.get('/api/shop/members')).status).toBe(401);
    expect((await second.post('/api/shop/members/00000000-0000-4000-8000-000000000000/disable')).status).toBe(404);
    await second.post(`/api/shop/members/${mine.id}/enable`).expect(200);
  });
});
