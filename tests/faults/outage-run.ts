import 'fake-indexeddb/auto';
import pg from 'pg';
import { publishLoopProcedure, Session, type Answer, type LoopWorld } from './bench-session';
import { startLane, startLoad, type Sent } from './load';
import { startAppProcess, throwawayDatabase, sleep, type AppProcess, type Database } from './processes';
import { phoneAgainst, type Phone } from './phone';

// A database outage under load, end to end: one real app server process, steady reads and step
// writes from several signed-in technicians and one phone running the real Bench outbox, then
// PostgreSQL stopped (fast shutdown) for a while and started again. The short run is part of the
// API suite (tests/server/outage.test.ts); `npm run verify:outage` is the long one.

export interface OutageOptions {
  /** how long PostgreSQL stays down */
  outageMs: number;
  readers: number;
  writers: number;
  /** load before the stop, and after the start */
  warmMs: number;
  afterMs: number;
  name: string;
  say?: (line: string) => void;
}


export interface OutageFigures {
  /** from the stop command to the database accepting connections again */
  outageSeconds: number;
  requests: number;
  unavailable: number;
  /** answers that were neither 2xx nor a proper 503, and requests that got no answer at all */
  unexpected: string[];
  /** 503 answers without the error envelope or without Retry-After */
  improper: string[];
  /** the slowest answer to a request sent while the database was down */
  slowestWhileDownMs: number;
  /** from the database accepting connections to the first stored step */
  recoveryMs: number;
  failuresAfterRecovery: number;
  acknowledgedWrites: number;
  acknowledgedLost: number;
  phone: { queued: number; answeredWhileDown: number; stored: number; extra: number; inOrder: boolean; leftOnPhone: number };
  signInWhileDown: number;
  limiterAfter: number[];
  freshSignInAfter: number;
  cacheBusBackMs: number;
  signOutHeardMs: number;
  appExited: number | string | null;
}

/** Runs the whole scenario on a database and an app server of its own; always cleans up. */
export async function runOutage(o: OutageOptions): Promise<OutageFigures> {
  const say = o.say ?? (() => undefined);
  const db = await throwawayDatabase(o.name);
  let app: AppProcess | null = null;
  let phone: Phone | null = null;
  try {
    // a low sign-in limit, so that the limiter's own PostgreSQL table is seen to work afterwards
    app = await startAppProcess(db.url, { LOGIN_RATE_LIMIT: '3' });
    const world = await publishLoopProcedure(db.url);
    const figures = await underLoad(o, db, app, world, say, (p) => { phone = p; });
    return figures;
  } catch (e) {
    if (app) say(`app server output:\n${app.output().slice(-4000)}`);
    throw e;
  } finally {
    (phone as Phone | null)?.restore();
    await app?.stop();
    await db.remove();
  }
}

async function underLoad(o: OutageOptions, db: Database, app: AppProcess, world: LoopWorld, say: (l: string) => void, keepPhone: (p: Phone) => void): Promise<OutageFigures> {
  const base = app.base;
  const lanes = await Promise.all(Array.from({ length: o.readers + o.writers }, () => startLane(base, world)));
  const phone = await phoneAgainst(base, await Session.signIn(base, 'tech@larkspur.test'), world);
  keepPhone(phone);
  const load = startLoad(base, { readers: lanes.slice(0, o.readers), writers: lanes.slice(o.readers), phone });

  await sleep(o.warmMs);
  say(`load running; stopping PostgreSQL for ${o.outageMs / 1000} s`);
  const stopAt = performance.now();
  const answeredBefore = phone.queued.length;
  await db.stop();
  const signInWhileDown = await wrongSignIn(base);
  await sleep(Math.max(0, o.outageMs - (performance.now() - stopAt)));
  await db.start();
  const upAt = performance.now();
  const answeredWhileDown = phone.queued.length - answeredBefore;
  const cacheBusBack = cacheBusBackAfter(db.url, upAt);
  say(`PostgreSQL is back after ${((upAt - stopAt) / 1000).toFixed(1)} s`);
  await sleep(o.afterMs);
  await load.stop();
  const leftOnPhone = await phone.drain(15_000);

  const check = new pg.Client({ connectionString: db.url });
  await check.connect();
  try {
    const stored = await check.query<{ id: string }>('SELECT id FROM diagnosis_steps WHERE id = ANY($1::uuid[])', [load.acknowledged]);
    const phoneRows = await check.query<{ id: string }>('SELECT id FROM diagnosis_steps WHERE diagnosis_id = $1 ORDER BY seq', [phone.diagnosisId]);
    const phoneIds = phoneRows.rows.map((r) => r.id);
    return {
      outageSeconds: (upAt - stopAt) / 1000,
      ...tally(load.sent, stopAt, upAt),
      acknowledgedWrites: load.acknowledged.length,
      acknowledgedLost: load.acknowledged.length - stored.rowCount!,
      phone: {
        queued: phone.queued.length,
        answeredWhileDown,
        stored: phoneIds.filter((id) => phone.queued.includes(id)).length,
        extra: phoneIds.filter((id) => !phone.queued.includes(id)).length,
        inOrder: JSON.stringify(phoneIds) === JSON.stringify(phone.queued),
        leftOnPhone,
      },
      signInWhileDown,
      ...(await afterTheOutage(base, check)),
      cacheBusBackMs: await cacheBusBack,
      appExited: app.exited(),
    };
  } finally {
    await check.end();
  }
}

/** What the answers say: 503s and their form, anything else, the slowest while down, the recovery. */
function tally(sent: Sent[], stopAt: number, upAt: number) {
  const firstWrite = sent.find((s) => s.kind === 'write' && s.at >= upAt && s.answer && s.answer.status < 300);
  const recoveredAt = firstWrite?.done ?? Number.POSITIVE_INFINITY;
  const whileDown = sent.filter((s) => s.at >= stopAt && s.at < upAt);
  return {
    requests: sent.length,
    unavailable: sent.filter((s) => s.answer?.status === 503).length,
    unexpected: sent.filter((s) => !s.answer || (s.answer.status >= 300 && s.answer.status !== 503))
      .map((s) => (s.answer ? `${s.kind} ${s.answer.status} ${JSON.stringify(s.answer.body).slice(0, 200)}` : `${s.kind}: no answer (${s.error})`)),
    improper: sent.filter((s) => s.answer?.status === 503 && !proper503(s.answer)).map((s) => JSON.stringify(s.answer!.body).slice(0, 200)),
    slowestWhileDownMs: Math.max(0, ...whileDown.map((s) => s.done - s.at)),
    recoveryMs: recoveredAt - upAt,
    failuresAfterRecovery: sent.filter((s) => s.at > recoveredAt && (!s.answer || s.answer.status >= 300)).length,
  };
}

/** A sign-in with a wrong password: 401 normally, 429 past the limit, 503 while the database is out. */
async function wrongSignIn(base: string): Promise<number> {
  return Session.signIn(base, 'lead@larkspur.test', 'not-the-password').then(() => 200, (e: Error) => Number(/failed: (\d+)/.exec(e.message)?.[1] ?? 0));
}

function proper503(a: Answer): boolean {
  const e = (a.body as { error?: { code?: unknown; message?: unknown; requestId?: unknown } }).error;
  return !!e && typeof e.code === 'string' && typeof e.message === 'string' && typeof e.requestId === 'string'
    && Number(a.headers.get('retry-after')) > 0;
}

/** The session store, the sign-in limiter and the cache bus, once the database is back. */
async function afterTheOutage(base: string, check: pg.Client) {
  const fresh = await Session.signIn(base, 'trainer@larkspur.test').then(() => 200, (e: Error) => Number(/failed: (\d+)/.exec(e.message)?.[1] ?? 0));
  const limiterAfter: number[] = [];
  for (let i = 0; i < 4; i++) limiterAfter.push(await wrongSignIn(base));
  // signed out by "another server": the row deleted and the eviction announced on the bus
  const s = await Session.signIn(base, 'author@larkspur.test');
  await s.get(base, '/api/auth/me');
  const sid = decodeURIComponent(s.cookie.slice('sw.sid='.length)).replace(/^s:/, '').split('.')[0]!;
  await check.query('DELETE FROM "session" WHERE sid = $1', [sid]);
  const t0 = performance.now();
  await check.query('SELECT pg_notify($1, $2)', ['sparkwright_cache', `session:${sid}`]);
  let signOutHeardMs = Number.POSITIVE_INFINITY;
  for (let i = 0; i < 30; i++) {
    if ((await s.get(base, '/api/auth/me')).status === 401) { signOutHeardMs = performance.now() - t0; break; }
    await sleep(50);
  }
  return { limiterAfter, freshSignInAfter: fresh, signOutHeardMs };
}

/** Milliseconds from `since` until the app's cache bus is listening again (Infinity after 20 s). */
async function cacheBusBackAfter(url: string, since: number): Promise<number> {
  const c = new pg.Client({ connectionString: url });
  c.on('error', () => undefined);
  await c.connect();
  try {
    while (performance.now() - since < 20_000) {
      const { rows } = await c.query(`SELECT 1 FROM pg_stat_activity WHERE application_name = 'sparkwright-cache-bus'`);
      if (rows.length) return performance.now() - since;
      await sleep(100);
    }
    return Number.POSITIVE_INFINITY;
  } finally {
    await c.end();
  }
}

/** The figures as a few lines for a person. */
export function describeFigures(f: OutageFigures): string {
  return [
    `outage: PostgreSQL down ${f.outageSeconds.toFixed(1)} s under load (${f.requests} requests)`,
    `503 answers: ${f.unavailable} (improper ${f.improper.length}); other failures: ${f.unexpected.length}; slowest answer while down: ${f.slowestWhileDownMs.toFixed(0)} ms`,
    `recovery: first stored step ${f.recoveryMs.toFixed(0)} ms after the database was back; failures after that: ${f.failuresAfterRecovery}`,
    `acknowledged writes: ${f.acknowledgedWrites}; acknowledged writes lost: ${f.acknowledgedLost}`,
    `phone outbox: ${f.phone.queued} steps answered (${f.phone.answeredWhileDown} while the database was down), ${f.phone.stored} stored once each, ${f.phone.extra} extra, in order: ${f.phone.inOrder ? 'yes' : 'no'}, left on the phone: ${f.phone.leftOnPhone}`,
    `sign-in while down: ${f.signInWhileDown}; after: fresh sign-in ${f.freshSignInAfter}, wrong passwords ${f.limiterAfter.join(' ')}`,
    `cache bus back ${f.cacheBusBackMs.toFixed(0)} ms after the database; a sign-out elsewhere heard in ${f.signOutHeardMs.toFixed(0)} ms`,
    `app process exited: ${f.appExited === null ? 'no' : f.appExited}`,
  ].join('\n');
}

/** The claims of the outage check, each as a sentence when it does not hold (empty: all hold). */
export function brokenClaims(f: OutageFigures): string[] {
  const claims: [boolean, string][] = [
    [f.appExited === null, `the app process exited (${f.appExited})`],
    [f.unavailable > 0, 'no request was answered 503 while the database was down'],
    [f.improper.length === 0, `${f.improper.length} answers 503 lacked the error envelope or Retry-After`],
    [f.unexpected.length === 0, `${f.unexpected.length} requests failed otherwise than 503: ${f.unexpected.slice(0, 3).join('; ')}`],
    [f.slowestWhileDownMs < 2000, `an answer while the database was down took ${f.slowestWhileDownMs.toFixed(0)} ms (over 2 s)`],
    [f.recoveryMs <= 5000, `serving again took ${f.recoveryMs.toFixed(0)} ms after the database was back (over 5 s)`],
    [f.failuresAfterRecovery === 0, `${f.failuresAfterRecovery} requests failed after the recovery`],
    [f.acknowledgedLost === 0, `${f.acknowledgedLost} acknowledged writes are not in the database`],
    [f.phone.answeredWhileDown > 0 && f.phone.leftOnPhone === 0 && f.phone.stored === f.phone.queued && f.phone.extra === 0 && f.phone.inOrder,
      `the phone's outbox did not deliver every step exactly once in order (${JSON.stringify(f.phone)})`],
    [f.signInWhileDown === 503, `a sign-in while the database was down answered ${f.signInWhileDown}, not 503`],
    [f.freshSignInAfter === 200, `a sign-in after the outage answered ${f.freshSignInAfter}`],
    [JSON.stringify(f.limiterAfter) === JSON.stringify([401, 401, 401, 429]), `the sign-in limiter after the outage answered ${f.limiterAfter.join(' ')}, not 401 401 401 429`],
    [f.signOutHeardMs < 1000, `a sign-out announced on the cache bus after the outage took ${f.signOutHeardMs} ms to be heard`],
  ];
  return claims.filter(([holds]) => !holds).map(([, sentence]) => sentence);
}
