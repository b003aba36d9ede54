import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import { startTestApp, signInAs, expectEnvelope, Client, type TestEnv } from './harness';
import { routeTable } from './route-table';
import { POLICY, ACTORS, expected, type Actor } from './authz-policy';
import { REQUESTS, type CellContext } from './authz-requests';
import { buildWorld, foreignShop, invitationToken, photoRow, resetToken, uploadPhoto, type ShopWorld } from './authz-world';
import { recordFigure } from './proof-figures';
import { Shop, User } from '../../server/models';

let env: TestEnv;
const callers = new Map<Actor, Client>();
let own: ShopWorld;
let foreign: ShopWorld;

const ACCOUNT: Record<Exclude<Actor, 'anonymous'>, 'admin' | 'author' | 'lead' | 'tech' | 'trainer'> = {
  admin: 'admin', author: 'author', lead: 'lead', technician: 'tech', trainer: 'trainer',
};
const emailOf = (a: Actor) => `${a === 'anonymous' ? 'tech' : ACCOUNT[a]}@larkspur.test`;

async function signedIn(actor: Actor, shopId: string): Promise<Client> {
  if (actor === 'anonymous') {
    const c = new Client(env.app);
    await c.fetchCsrf(); // a signed-out write with a valid token must meet the 401, not the CSRF check
    return c;
  }
  const c = await signInAs(env.app, ACCOUNT[actor]);
  // the trainer also covers a second shop: point every session at the demo shop
  await c.post('/api/auth/shop', { shopId }).expect(200);
  return c;
}

beforeAll(async () => {
  env = await startTestApp();
  const shopId = (await Shop.findOne({ where: { slug: 'larkspur-lane' } }))!.id;
  for (const a of ACTORS) callers.set(a, await signedIn(a, shopId));
  const tech = callers.get('technician')!;
  const techId = (await User.findOne({ where: { email: 'tech@larkspur.test' } }))!.id;
  own = await buildWorld(env, shopId, techId, uploadPhoto(tech));
  const other = await foreignShop(['admin', 'author', 'lead', 'technician', 'trainer']);
  foreign = await buildWorld(env, other.shopId, other.userId, (diagnosisId) => photoRow(other.shopId, diagnosisId));
}, 120_000);
afterAll(async () => { await env.close(); });

function cellContext(actor: Actor, w: ShopWorld): CellContext {
  return {
    c: callers.get(actor)!, w, email: emailOf(actor),
    spare: () => signedIn(actor, own.shopId),
    invitationToken: () => invitationToken(own.shopId),
    resetToken,
  };
}

describe('the authorization matrix, built from the route table', () => {
  it('every route of the app has a policy row and a request, and every row names a route', () => {
    const routes = routeTable(env.app).map((r) => r.key);
    expect(routes.length).toBeGreaterThan(60);
    expect(routes.filter((k) => !POLICY[k]), 'routes without a policy row in authz-policy.ts').toEqual([]);
    expect(routes.filter((k) => !REQUESTS[k]), 'routes without a request in authz-requests.ts').toEqual([]);
    expect(Object.keys(POLICY).filter((k) => !routes.includes(k)), 'policy rows for routes that no longer exist').toEqual([]);
    expect(Object.keys(REQUESTS).filter((k) => !routes.includes(k)), 'requests for routes that no longer exist').toEqual([]);
  });

  it('every route answers each caller, at its own shop and at a foreign shop id, as the policy says', async () => {
    const wrong: string[] = [];
    let cells = 0;
    let foreignCells = 0;
    for (const { key } of routeTable(env.app)) {
      const rule = POLICY[key];
      const req = REQUESTS[key];
      if (!rule || !req) continue; // reported by the test above
      await Promise.all(ACTORS.map(async (actor) => {
        for (const target of req.foreign ? (['own', 'foreign'] as const) : (['own'] as const)) {
          const want = expected(rule, actor, target);
          const res = await req.send(cellContext(actor, target === 'own' ? own : foreign));
          cells++;
          if (target === 'foreign') foreignCells++;
          const ok = want === 'ok' ? res.status >= 200 && res.status < 300 : res.status === want;
          if (!ok) wrong.push(`${key} as ${actor} at ${target} shop: expected ${want}, got ${res.status} ${res.text.slice(0, 160)}`);
          else if (res.status >= 400) expectEnvelope(res.body);
        }
      }));
    }
    const routes = Object.keys(POLICY).length;
    console.log(`authorization matrix: ${routes} routes × ${ACTORS.length} callers, ${cells} cells checked (${foreignCells} at a foreign shop's id)`);
    recordFigure('matrix', { routes, callers: ACTORS.length, cells, foreignCells, wrong: wrong.length });
    expect(wrong).toEqual([]);
  }, 120_000);
});
