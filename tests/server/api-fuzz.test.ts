import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import fc from 'fast-check';
import { QueryTypes } from 'sequelize';
import { startTestApp, Client, DEMO_PASSWORD, type TestEnv } from './harness';
import { routeTable, type RouteEntry } from './route-table';
import { buildWorld, uploadPhoto, type ShopWorld } from './authz-world';
import { exampleBodies } from './fuzz-examples';
import { bodyFor, paramValue, queryString } from './fuzz-inputs';
import { recordFigure } from './proof-figures';
import { Membership, Shop, User } from '../../server/models';
import { hashPassword } from '../../server/lib/passwords';

/** 200 runs per route in `npm test`; `npm run verify:fuzz` sets FUZZ_RUNS=2000. */
const RUNS = Number(process.env.FUZZ_RUNS ?? 200);
/** Routes that start, replace or end the session they run in: fuzzed in a session of their own. */
const SESSION_ROUTES = new Set(['POST /api/auth/login', 'POST /api/auth/logout', 'POST /api/auth/invitations/accept', 'POST /api/auth/password/reset', 'POST /api/auth/password/forgot']);
/** Text only the database, the ORM or a stack trace would write; never in an answer unless the request carried it. */
const LEAKS = [/syntax error at or near/i, /relation "/i, /violates .*constraint/i, /invalid input syntax/i, /sequelize/i, /SQLSTATE/i, /\bat .+\.(ts|js):\d+/, /node_modules/, /\/work\//, /\bSELECT\b[\s\S]*\bFROM\b/i, /\bINSERT INTO\b/i];

let env: TestEnv;
let fuzzer: Client;
let world: ShopWorld;
let draft: { procedureId: string; versionId: string };
let invitationId: string;
let examples: Record<string, unknown>;
let fingerprintSql: string;
const figures = { routes: 0, runs: 0, serverErrors: 0, leaks: 0, halfStored: 0 };

beforeAll(async () => {
  env = await startTestApp({ LOGIN_RATE_LIMIT: '100000' });
  const shop = (await Shop.findOne({ where: { slug: 'larkspur-lane' } }))!;
  // one member with every role, so that each route's checks past the role check are fuzzed too
  const user = await User.create({ email: 'fuzzer@larkspur.test', name: 'Fuzz Everything', passwordHash: await hashPassword(DEMO_PASSWORD) });
  await Membership.create({ shopId: shop.id, userId: user.id, roles: ['admin', 'author', 'lead', 'technician', 'trainer'] });
  fuzzer = new Client(env.app);
  expect((await fuzzer.signIn('fuzzer@larkspur.test')).status).toBe(200);
  world = await buildWorld(env, shop.id, user.id, uploadPhoto(fuzzer));
  draft = await world.fresh.version('draft');
  invitationId = await world.fresh.invitation();
  examples = exampleBodies(world, 'fuzzer@larkspur.test');
  const [tables] = await env.runtime.deps.sequelize.query(
    `SELECT tablename FROM pg_tables WHERE schemaname = 'public' AND tablename NOT IN ('schema_migrations', 'session', 'rate_limits') ORDER BY 1`,
  );
  // rows and the newest row version of every table: an insert, update or delete changes it
  fingerprintSql = `SELECT concat_ws(',', ${(tables as { tablename: string }[])
    .map(({ tablename: t }) => `(SELECT count(*) || ':' || coalesce(max(xmin::text::bigint), 0) FROM "${t}")`).join(', ')}) AS f`;
}, 120_000);
afterAll(async () => {
  recordFigure('fuzz', { runsPerRoute: RUNS, ...figures });
  console.log(`fuzz: ${figures.routes} routes × ${RUNS} runs = ${figures.runs} requests; ${figures.serverErrors} answered 5xx, ${figures.leaks} leaked internals, ${figures.halfStored} stored something while refusing`);
  await env.close();
});

async function fingerprint(): Promise<string> {
  const [row] = await env.runtime.deps.sequelize.query<{ f: string }>(fingerprintSql, { type: QueryTypes.SELECT });
  return row!.f;
}

function realParam(route: RouteEntry, name: string): string {
  const p = route.path;
  if (name === 'versionId') return draft.versionId;
  if (name === 'slug') return world.slug;
  if (name === 'token') return 'not-a-real-invitation-token';
  if (name === 'size') return 'phone';
  if (p.startsWith('/api/pictures/')) return world.pictureId;
  if (p.startsWith('/api/procedures/:id/versions')) return draft.procedureId;
  if (p.startsWith('/api/procedures/')) return world.procedureId;
  if (p.includes('/diagnoses/')) return world.diagnosisId;
  if (p.startsWith('/api/attachments/')) return world.attachmentId;
  if (p.startsWith('/api/vehicles/')) return world.vehicleId;
  if (p.startsWith('/api/shop/members/')) return world.memberId;
  if (p.startsWith('/api/shop/invitations/')) return invitationId;
  if (p.startsWith('/api/bench/versions/')) return world.versionId;
  throw new Error(`the fuzz test does not know what to put in :${name} of ${route.key}: add it to realParam`);
}

function requestArbitrary(route: RouteEntry) {
  const names = [...route.path.matchAll(/:(\w+)/g)].map((m) => m[1]!);
  const params = fc.tuple(...names.map((n) => paramValue(realParam(route, n))));
  const body = route.method === 'GET' || route.method === 'DELETE'
    ? fc.constant(undefined)
    : bodyFor(examples[route.key] ?? {}).map((b) => b as { text: string; describe: string } | undefined);
  return fc.record({ params, query: queryString, body });
}

/** Stack traces never; SQL and ORM text only in refusals (a 200 may rightly show stored text that looks like SQL). */
const STACK = LEAKS.slice(6, 9);
const leakIn = (text: string, sent: string, status: number) => (status >= 400 ? LEAKS : STACK).find((re) => re.test(text) && !re.test(sent));

/** Fuzzes one route; returns its smallest failing case, or null. */
async function fuzzRoute(route: RouteEntry): Promise<string | null> {
  figures.routes++;
  const session = SESSION_ROUTES.has(route.key) ? new Client(env.app) : fuzzer;
  await session.fetchCsrf();
  const writes = route.method !== 'GET';
  let before = writes ? await fingerprint() : '';
  const t0 = performance.now();
  const failure = await fc.assert(fc.asyncProperty(requestArbitrary(route), async ({ params, query, body }) => {
    figures.runs++;
    let i = 0;
    const url = route.path.replace(/:(\w+)/g, () => params[i++]!) + (query ? `?${query}` : '');
    const method = route.method.toLowerCase() as 'get' | 'post' | 'put' | 'patch' | 'delete';
    let req = session.agent[method](url).set('X-CSRF-Token', session.csrf);
    if (body) req = req.set('Content-Type', 'application/json').send(body.text);
    const res = await req;
    const text = typeof res.text === 'string' ? res.text : ''; // a photo answers bytes
    const sent = `${url} ${body?.text.slice(0, 10_000) ?? ''}`;
    const where = `${route.key} with ${body?.describe ?? 'no body'}: ${res.status} ${text.slice(0, 300)}`;
    if (res.status >= 500) figures.serverErrors++;
    expect(res.status, where).toBeLessThan(500);
    const leak = leakIn(text, sent, res.status);
    if (leak) figures.leaks++;
    expect(leak, `${where} (matches ${String(leak)})`).toBeUndefined();
    expect(({} as Record<string, unknown>).polluted, 'Object.prototype was polluted').toBeUndefined();
    if (!writes) return;
    const after = await fingerprint();
    if (res.status >= 400 && after !== before) figures.halfStored++;
    if (res.status >= 400) expect(after, `${where}: refused, but rows changed`).toBe(before);
    before = after;
    if (res.status < 300) await session.fetchCsrf(); // a sign-in or sign-out renews the token
  }), { numRuns: RUNS }).then(() => null, (e: unknown) => {
    const cause = e instanceof Error ? String((e.cause as Error | undefined)?.message ?? '') : '';
    return `${route.key}: ${e instanceof Error ? e.message.slice(0, 600) : String(e)} ${cause.slice(0, 600)}`;
  });
  if (process.env.FUZZ_PROFILE) console.log(`${route.key}: ${Math.round(performance.now() - t0)} ms`);
  return failure;
}

describe('fuzzing every API route', () => {
  it(`every route survives ${RUNS} hostile requests: no 5xx, no internals in the answer, nothing half-stored`, async () => {
    const routes = routeTable(env.app);
    expect(routes.length).toBeGreaterThan(60);
    // Reads store nothing the check looks at, so they run beside the writes; the writes run one at
    // a time, so that a change of rows belongs to the request just answered. Every route is fuzzed
    // even after one fails, and each failure is reported with its smallest case.
    const chain = async (list: RouteEntry[]) => {
      const out: string[] = [];
      for (const r of list) {
        const f = await fuzzRoute(r);
        if (f) out.push(f);
      }
      return out;
    };
    const failures = (await Promise.all([chain(routes.filter((r) => r.method !== 'GET')), chain(routes.filter((r) => r.method === 'GET'))])).flat();
    expect(failures).toEqual([]);
  }, Math.max(300_000, RUNS * 1_500));
});
