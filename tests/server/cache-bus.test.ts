import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import pg from 'pg';
import { startTestApp, signInAs, expectEnvelope, Client, type TestEnv } from './harness';
import { Membership, User } from '../../server/models';

// Each app server keeps sessions and roles briefly in memory. What another server changes must
// reach this one at once: these tests play the other server with a plain pg connection that
// changes the database and sends the NOTIFY that server would send.

let env: TestEnv;
let other: pg.Client;
beforeAll(async () => {
  env = await startTestApp();
  other = new pg.Client({ connectionString: process.env.DATABASE_URL });
  await other.connect();
});
afterAll(async () => {
  await other.end();
  await env.close();
});

/** Signs a demo account in; returns the client and its session id (cookie sw.sid=s:<sid>.<signature>). */
async function signedIn(who: string): Promise<{ c: Client; sid: string }> {
  const c = new Client(env.app);
  const res = await c.signIn(`${who}@larkspur.test`);
  expect(res.status).toBe(200);
  const cookie = ([] as string[]).concat(res.headers['set-cookie'] ?? []).find((x) => x.startsWith('sw.sid='))!;
  const sid = decodeURIComponent(cookie.split(';')[0]!.slice('sw.sid='.length)).replace(/^s:/, '').split('.')[0]!;
  await c.get('/api/auth/me').expect(200); // now remembered by this server
  return { c, sid };
}

/** Polls a request until it answers `status` (the NOTIFY travels asynchronously), at most 3 s. */
async function answers(send: () => Promise<{ status: number }>, status: number): Promise<number> {
  let last = 0;
  for (let i = 0; i < 30; i++) {
    last = (await send()).status;
    if (last === status) return last;
    await new Promise((r) => setTimeout(r, 100));
  }
  return last;
}

describe('the cache bus between app servers', () => {
  it('a sign-out on another server ends the session here at once, not after the cache lifetime', async () => {
    const { c, sid } = await signedIn('tech');
    await other.query('DELETE FROM "session" WHERE sid = $1', [sid]);
    expect((await c.get('/api/auth/me')).status).toBe(200); // still remembered: nobody said otherwise
    await other.query('SELECT pg_notify($1, $2)', ['sparkwright_cache', `session:${sid}`]);
    expect(await answers(() => c.get('/api/auth/me'), 401)).toBe(401);
  });

  it('a role given on another server applies here at once', async () => {
    const trainer = await signInAs(env.app, 'trainer');
    const res = await trainer.get('/api/shop/members');
    expect(res.status).toBe(403);
    expectEnvelope(res.body);
    const user = (await User.findOne({ where: { email: 'trainer@larkspur.test' } }))!;
    const m = (await Membership.findOne({ where: { userId: user.id } }))!;
    await other.query(`UPDATE memberships SET roles = array_append(roles, 'admin') WHERE id = $1`, [m.id]);
    await other.query('SELECT pg_notify($1, $2)', ['sparkwright_cache', `membership:${user.id}:${m.shopId}`]);
    expect(await answers(() => trainer.get('/api/shop/members'), 200)).toBe(200);
    await other.query(`UPDATE memberships SET roles = array_remove(roles, 'admin') WHERE id = $1`, [m.id]);
    await other.query('SELECT pg_notify($1, $2)', ['sparkwright_cache', `membership:${user.id}:${m.shopId}`]);
    expect(await answers(() => trainer.get('/api/shop/members'), 403)).toBe(403);
  });

  it('when the bus loses its connection, everything cached is forgotten, and the bus comes back', async () => {
    const { c, sid } = await signedIn('lead');
    await other.query('DELETE FROM "session" WHERE sid = $1', [sid]);
    await other.query(`SELECT pg_terminate_backend(pid) FROM pg_stat_activity WHERE application_name = 'sparkwright-cache-bus'`);
    expect(await answers(() => c.get('/api/auth/me'), 401)).toBe(401); // read from the database again
    // back within a few seconds: a NOTIFY is heard again
    const { c: again, sid: sid2 } = await signedIn('lead');
    await other.query('DELETE FROM "session" WHERE sid = $1', [sid2]);
    await new Promise((r) => setTimeout(r, 6000));
    await other.query('SELECT pg_notify($1, $2)', ['sparkwright_cache', `session:${sid2}`]);
    expect(await answers(() => again.get('/api/auth/me'), 401)).toBe(401);
  }, 20_000);
});
