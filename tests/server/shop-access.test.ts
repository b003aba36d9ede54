import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import { startTestApp, signInAs, otherShopMember, expectEnvelope, Client, DEMO_PASSWORD, type TestEnv } from './harness';
import { hashPassword } from '../../server/lib/passwords';
import { Vehicle, Membership, User, Invitation } from '../../server/models';

let env: TestEnv;
let admin: Client;
let tech: Client;
let trainer: Client;
let outsider: Client;
beforeAll(async () => {
  env = await startTestApp();
  admin = await signInAs(env.app, 'admin');
  tech = await signInAs(env.app, 'tech');
  trainer = await signInAs(env.app, 'trainer');
  outsider = await otherShopMember(env, ['admin', 'technician', 'lead', 'trainer', 'author']);
});
afterAll(async () => { await env.close(); });

describe('roles on the shop routes', () => {
  it('only an admin reads and changes members, invitations and settings', async () => {
    for (const c of [tech, trainer]) {
      expect((await c.get('/api/shop/members')).status).toBe(403);
      expect((await c.get('/api/shop/invitations')).status).toBe(403);
      expect((await c.post('/api/shop/invitations', { email: 'x@larkspur.test', roles: ['technician'] })).status).toBe(403);
      expect((await c.put('/api/shop/settings', { name: 'X', settings: { comebackDays: 3, abandonAfterHours: 3, serviceDeskEmail: '' } })).status).toBe(403);
      expect((await c.get('/api/shop/mail')).status).toBe(403);
    }
    const members = await admin.get('/api/shop/members').expect(200);
    expect(members.body.map((m: { email: string }) => m.email).sort()).toEqual([
      'admin@larkspur.test', 'author@larkspur.test', 'lead@larkspur.test', 'tech@larkspur.test', 'trainer@larkspur.test',
    ]);
  });

  it('a trainer may look machines up but not add them; a technician may add them', async () => {
    await trainer.get('/api/vehicles').expect(200);
    const denied = await trainer.post('/api/vehicles', { label: 'T-9' });
    expect(denied.status).toBe(403);
    expect(expectEnvelope(denied.body).code).toBe('forbidden');
    await tech.post('/api/vehicles', { label: 'T-9', model: 'Wren 50' }).expect(201);
  });

  it('signed-out requests get 401 with the envelope', async () => {
    const { default: request } = await import('supertest');
    const res = await request(env.app).get('/api/vehicles').expect(401);
    expect(expectEnvelope(res.body).code).toBe('unauthenticated');
  });

  it("a member's new roles, and their removal, apply from their very next request", async () => {
    const user = await User.create({ email: 'wren@larkspur.test', name: 'Wren Apprentice', passwordHash: await hashPassword(DEMO_PASSWORD) });
    const shopId = (await Membership.findOne({ where: { userId: (await User.findOne({ where: { email: 'admin@larkspur.test' } }))!.id } }))!.shopId;
    const m = await Membership.create({ shopId, userId: user.id, roles: ['technician'] });
    const wren = new Client(env.app);
    expect((await wren.signIn('wren@larkspur.test')).status).toBe(200);
    expect((await wren.get('/api/shop/members')).status).toBe(403); // read once, so now remembered
    await admin.patch(`/api/shop/members/${m.id}`, { roles: ['technician', 'admin'] }).expect(200);
    await wren.get('/api/shop/members').expect(200);
    await admin.delete(`/api/shop/members/${m.id}`).expect(204);
    const gone = await wren.get('/api/vehicles');
    expect(gone.status).toBe(403);
    expect(expectEnvelope(gone.body).code).toBe('no_shop');
  });

  it('the last admin cannot remove their own admin role', async () => {
    const members = await admin.get('/api/shop/members').expect(200);
    const me = members.body.find((m: { email: string }) => m.email === 'admin@larkspur.test');
    const res = await admin.patch(`/api/shop/members/${me.id}`, { roles: ['technician'] });
    expect(res.status).toBe(409);
    expect(expectEnvelope(res.body).code).toBe('last_admin');
  });
});

describe('nothing crosses shops', () => {
  it('every id of shop A answers 404 to a member of shop B, whatever their roles', async () => {
    const wren = await Vehicle.findOne({ where: { label: 'W-01' } });
    const lead = await User.findOne({ where: { email: 'lead@larkspur.test' } });
    const membership = await Membership.findOne({ where: { userId: lead!.id } });
    expect((await outsider.get(`/api/vehicles/${wren!.id}`)).status).toBe(404);
    expect((await outsider.put(`/api/vehicles/${wren!.id}`, { label: 'stolen' })).status).toBe(404);
    expect((await outsider.patch(`/api/shop/members/${membership!.id}`, { roles: ['admin'] })).status).toBe(404);
    expect((await outsider.delete(`/api/shop/members/${membership!.id}`)).status).toBe(404);
    const inv = await admin.post('/api/shop/invitations', { email: 'cross@larkspur.test', roles: ['technician'] }).expect(201);
    expect((await outsider.delete(`/api/shop/invitations/${inv.body.id}`)).status).toBe(404);
    // and the rows are untouched
    expect((await Vehicle.findByPk(wren!.id))!.label).toBe('W-01');
    expect((await Membership.findByPk(membership!.id))!.roles).toEqual(['lead']);
    expect(await Invitation.findByPk(inv.body.id)).not.toBeNull();
  });

  it("shop B's lists never include shop A's rows", async () => {
    const list = await outsider.get('/api/vehicles').expect(200);
    expect(list.body).toEqual([]);
    const members = await outsider.get('/api/shop/members').expect(200);
    expect(members.body.map((m: { email: string }) => m.email)).toEqual(['other@elsewhere.test']);
  });

  it('a malformed id is a 404 too, not a server error', async () => {
    const res = await admin.get('/api/vehicles/not-a-uuid');
    expect(res.status).toBe(404);
    expectEnvelope(res.body);
  });

  it('switching to a shop one is not a member of answers 404', async () => {
    const res = await tech.post('/api/auth/shop', { shopId: '00000000-0000-4000-8000-000000000000' });
    expect(res.status).toBe(404);
  });
});

describe('bad input', () => {
  it('a machine with a mistyped VIN gets 400 with a field issue and nothing is stored', async () => {
    const before = await Vehicle.count();
    // 49 CFR 565.15: 1M8GDM9AXKP042788 has check digit X; a 5 in its place is wrong
    const res = await admin.post('/api/vehicles', { label: 'V-1', frameNumber: '1M8GDM9A5KP042788' });
    expect(res.status).toBe(400);
    const err = expectEnvelope(res.body);
    expect(err.issues).toEqual([expect.objectContaining({ path: 'frameNumber', message: expect.stringContaining('check digit') })]);
    expect(await Vehicle.count()).toBe(before);
  });

  it('a machine with an empty label and negative hours gets one issue per field', async () => {
    const res = await admin.post('/api/vehicles', { label: ' ', hours: -3 });
    expect(res.status).toBe(400);
    expect(expectEnvelope(res.body).issues!.map((i) => i.path).sort()).toEqual(['hours', 'label']);
  });

  it('a duplicate label answers 409 naming the field', async () => {
    const res = await admin.post('/api/vehicles', { label: 'W-01' });
    expect(res.status).toBe(409);
    expect(expectEnvelope(res.body).issues).toEqual([expect.objectContaining({ path: 'label' })]);
  });

  it('a valid 17-character VIN and a short frame number are both accepted as typed', async () => {
    await admin.post('/api/vehicles', { label: 'V-2', frameNumber: '1M8GDM9AXKP042788' }).expect(201);
    await admin.post('/api/vehicles', { label: 'V-3', frameNumber: 'WRN50-0099' }).expect(201);
  });

  it('an unknown API route answers 404 with the envelope', async () => {
    const res = await admin.get('/api/shop/nothing-here');
    expect(res.status).toBe(404);
    expectEnvelope(res.body);
  });
});
