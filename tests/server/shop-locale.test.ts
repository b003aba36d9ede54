import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startTestApp, signInAs, otherShopMember, expectEnvelope, type Client, type TestEnv } from './harness';
import { publishBenchProcedure, startBody, stepBody } from './bench-fixtures';
import { AuditLog, Shop } from '../../server/models';

let env: TestEnv;
let admin: Client;
let tech: Client;
let trainer: Client;
let lead: Client;
beforeAll(async () => {
  env = await startTestApp();
  admin = await signInAs(env.app, 'admin');
  tech = await signInAs(env.app, 'tech');
  trainer = await signInAs(env.app, 'trainer');
  lead = await signInAs(env.app, 'lead');
});
afterAll(async () => env?.close());

const demoShop = async () => (await Shop.findOne({ where: { slug: 'larkspur-lane' } }))!;
const body = (locale: unknown) => ({
  name: 'Larkspur Lane Powersports',
  settings: { comebackDays: 30, abandonAfterHours: 24, serviceDeskEmail: 'desk@larkspur.test' },
  locale,
});
const currentShop = (me: { shops: { id: string; locale: string | null }[]; currentShopId: string }) => me.shops.find((s) => s.id === me.currentShopId)!;

describe("the shop's locale", () => {
  it('starts unset, so every device follows its browser, and the session says so', async () => {
    await (await demoShop()).update({ locale: null });
    expect((await admin.get('/api/shop/settings').expect(200)).body.locale).toBeNull();
    expect(currentShop((await tech.get('/api/auth/session').expect(200)).body).locale).toBeNull();
  });

  it('an admin may set it; the tag is stored in its canonical form and every member sees it in the session', async () => {
    const res = await admin.put('/api/shop/settings', body('de-de')).expect(200);
    expect(res.body.locale).toBe('de-DE');
    expect((await demoShop()).locale).toBe('de-DE');
    for (const c of [tech, trainer, lead]) expect(currentShop((await c.get('/api/auth/session').expect(200)).body).locale).toBe('de-DE');
    expect(currentShop((await tech.get('/api/auth/me').expect(200)).body).locale).toBe('de-DE');
    const logged = await AuditLog.findOne({ where: { action: 'shop.settings_changed' }, order: [['createdAt', 'DESC']] });
    expect(logged?.detail).toEqual({ locale: 'de-DE' });
  });

  it('no one but an admin may change it, and a refusal changes nothing', async () => {
    for (const c of [tech, trainer, lead]) {
      const res = await c.put('/api/shop/settings', body('en-US'));
      expect(res.status).toBe(403);
      expect(expectEnvelope(res.body).code).toBe('forbidden');
    }
    expect((await demoShop()).locale).toBe('de-DE');
  });

  it.each([['not a tag'], ['xx'], ['en_US'], ['a'.repeat(65)], [42]])('refuses %j with 400 saying what to do, storing nothing', async (tag) => {
    const before = await demoShop();
    const res = await admin.put('/api/shop/settings', { ...body(tag), name: 'Renamed by a refused request' });
    expect(res.status).toBe(400);
    const err = expectEnvelope(res.body);
    expect(err.issues?.some((i) => i.path === 'locale')).toBe(true);
    expect(err.message + JSON.stringify(err.issues)).toMatch(/such as de-DE/);
    const after = await demoShop();
    expect(after.locale).toBe('de-DE');
    expect(after.name).toBe(before.name);
  });

  it('leaving the locale out keeps it; null or empty text goes back to following the browser', async () => {
    const { locale: _dropped, ...withoutLocale } = body(undefined);
    expect((await admin.put('/api/shop/settings', withoutLocale).expect(200)).body.locale).toBe('de-DE');
    expect((await admin.put('/api/shop/settings', body('')).expect(200)).body.locale).toBeNull();
    await admin.put('/api/shop/settings', body('de-DE')).expect(200);
    expect((await admin.put('/api/shop/settings', body(null)).expect(200)).body.locale).toBeNull();
  });

  it("another shop's admin changes only their own shop's locale", async () => {
    const outsider = await otherShopMember(env, ['admin'], 'locale-admin@elsewhere.test');
    await outsider.put('/api/shop/settings', { ...body('fr-FR'), name: 'Elsewhere' }).expect(200);
    expect((await demoShop()).locale).toBeNull();
  });
});

describe('the e-mailed report in the shop locale', () => {
  it('writes the start time in German order, on the 24-hour clock and with its time zone, when the shop is de-DE', async () => {
    await admin.put('/api/shop/settings', body('de-DE')).expect(200);
    const world = await publishBenchProcedure();
    const start = startBody(world);
    await tech.post('/api/diagnoses', start).expect(201);
    const a = (await tech.post(`/api/diagnoses/${start.id}/steps`, stepBody('killLead', null)).expect(201)).body;
    await tech.post(`/api/diagnoses/${start.id}/steps`, stepBody('sparkTest', a.id, { answerId: 'none' })).expect(201);
    await tech.post(`/api/diagnoses/${start.id}/report`, {}).expect(200);
    const mail = await env.smtp.waitFor((m) => m.subject.startsWith('Diagnosis report') && m.to.includes('desk@larkspur.test'));
    // CLDR de: day first, abbreviated month with a point ("2. Dez. 2026"), 24-hour time
    const started = /Started: (.+)/.exec(mail.text)![1]!;
    expect(started).toMatch(/^\d{1,2}\. \p{L}+\.? \d{4}, \d{2}:\d{2} \S+$/u);
    expect(started).not.toMatch(/AM|PM|T\d{2}:/);
  });
});
