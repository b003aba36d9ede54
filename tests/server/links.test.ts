import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import { startTestApp, signInAs, Client, expectEnvelope, type TestEnv } from './harness';
import { Invitation, PasswordReset, Membership, User } from '../../server/models';

let env: TestEnv;
beforeAll(async () => { env = await startTestApp(); });
afterAll(async () => { await env.close(); });

const tokenIn = (text: string, page: string) => new RegExp(`/${page}\\?token=([\\w-]+)`).exec(text)?.[1] ?? '';

describe('invitations', () => {
  it('an invitation e-mail lands in the fake receiver and its link works once', async () => {
    const admin = await signInAs(env.app, 'admin');
    await admin.post('/api/shop/invitations', { email: 'junior@larkspur.test', name: 'Jamie', roles: ['technician'] }).expect(201);
    const mail = await env.smtp.waitFor((m) => m.to.includes('junior@larkspur.test'));
    expect(mail.subject).toContain('Larkspur Lane Powersports');
    const token = tokenIn(mail.text, 'invitation');
    expect(token.length).toBeGreaterThan(20);

    const preview = await new Client(env.app).get(`/api/auth/invitations/${token}`).expect(200);
    expect(preview.body).toMatchObject({ email: 'junior@larkspur.test', roles: ['technician'], hasAccount: false });

    const newcomer = new Client(env.app);
    await newcomer.fetchCsrf();
    const accepted = await newcomer.post('/api/auth/invitations/accept', { token, name: 'Jamie Junior', password: 'a-long-enough-password' }).expect(200);
    expect(accepted.body.shops[0]).toMatchObject({ name: 'Larkspur Lane Powersports', roles: ['technician'] });
    await newcomer.get('/api/auth/me').expect(200);

    const again = new Client(env.app);
    await again.fetchCsrf();
    const second = await again.post('/api/auth/invitations/accept', { token, name: 'Someone Else', password: 'another-long-password' });
    expect(second.status).toBe(410);
    expect(expectEnvelope(second.body).code).toBe('link_expired');
    expect(await User.count({ where: { email: 'junior@larkspur.test' } })).toBe(1);
  });

  it('an expired invitation is refused and creates no account', async () => {
    const admin = await signInAs(env.app, 'admin');
    await admin.post('/api/shop/invitations', { email: 'late@larkspur.test', roles: ['trainer'] }).expect(201);
    const mail = await env.smtp.waitFor((m) => m.to.includes('late@larkspur.test'));
    await Invitation.update({ expiresAt: new Date(Date.now() - 1000) }, { where: { email: 'late@larkspur.test' } });
    const c = new Client(env.app);
    await c.fetchCsrf();
    const res = await c.post('/api/auth/invitations/accept', { token: tokenIn(mail.text, 'invitation'), name: 'Late', password: 'a-long-enough-password' });
    expect(res.status).toBe(410);
    expect(await User.count({ where: { email: 'late@larkspur.test' } })).toBe(0);
  });

  it('a weak password on acceptance gets a field issue and the invitation stays open', async () => {
    const admin = await signInAs(env.app, 'admin');
    await admin.post('/api/shop/invitations', { email: 'weak@larkspur.test', roles: ['author'] }).expect(201);
    const mail = await env.smtp.waitFor((m) => m.to.includes('weak@larkspur.test'));
    const c = new Client(env.app);
    await c.fetchCsrf();
    const res = await c.post('/api/auth/invitations/accept', { token: tokenIn(mail.text, 'invitation'), name: 'Weak', password: 'short' });
    expect(res.status).toBe(400);
    expect(expectEnvelope(res.body).issues).toEqual([expect.objectContaining({ path: 'password' })]);
    expect((await Invitation.findOne({ where: { email: 'weak@larkspur.test' } }))!.acceptedAt).toBeNull();
  });

  it('inviting someone who is already a member answers 409 and changes nothing', async () => {
    const admin = await signInAs(env.app, 'admin');
    await admin.post('/api/shop/invitations', { email: 'tech@larkspur.test', roles: ['author'] }).expect(409);
    const lead = await User.findOne({ where: { email: 'lead@larkspur.test' } });
    expect(await Membership.count({ where: { userId: lead!.id } })).toBe(1);
  });
});

describe('password reset', () => {
  it('a reset link arrives by e-mail, works once, and the new password signs in', async () => {
    const c = new Client(env.app);
    await c.fetchCsrf();
    await c.post('/api/auth/password/forgot', { email: 'author@larkspur.test' }).expect(202);
    const mail = await env.smtp.waitFor((m) => m.to.includes('author@larkspur.test') && m.subject.includes('Reset'));
    const token = tokenIn(mail.text, 'reset-password');
    await c.post('/api/auth/password/reset', { token, password: 'a-brand-new-password' }).expect(204);
    const second = await c.post('/api/auth/password/reset', { token, password: 'yet-another-password' });
    expect(second.status).toBe(410);
    expect((await new Client(env.app).signIn('author@larkspur.test', 'a-brand-new-password')).status).toBe(200);
  });

  it("a password reset signs the person out of every other session", async () => {
    const elsewhere = await signInAs(env.app, 'lead');
    await elsewhere.get('/api/auth/me').expect(200);
    const c = new Client(env.app);
    await c.fetchCsrf();
    await c.post('/api/auth/password/forgot', { email: 'lead@larkspur.test' }).expect(202);
    const mail = await env.smtp.waitFor((m) => m.to.includes('lead@larkspur.test') && m.subject.includes('Reset'));
    await c.post('/api/auth/password/reset', { token: tokenIn(mail.text, 'reset-password'), password: 'lead-new-password-1' }).expect(204);
    await elsewhere.get('/api/auth/me').expect(401);
  });

  it('an unknown e-mail gets the same answer and no mail', async () => {
    const c = new Client(env.app);
    await c.fetchCsrf();
    const before = env.smtp.messages().length;
    const res = await c.post('/api/auth/password/forgot', { email: 'nobody@larkspur.test' }).expect(202);
    expect(res.body.message).toContain('If that e-mail has an account');
    await new Promise((r) => setTimeout(r, 200));
    expect(env.smtp.messages().length).toBe(before);
  });

  it('an expired reset link is refused and the password stays', async () => {
    const c = new Client(env.app);
    await c.fetchCsrf();
    await c.post('/api/auth/password/forgot', { email: 'trainer@larkspur.test' }).expect(202);
    const mail = await env.smtp.waitFor((m) => m.to.includes('trainer@larkspur.test') && m.subject.includes('Reset'));
    await PasswordReset.update({ expiresAt: new Date(Date.now() - 1000) }, { where: {} });
    const res = await c.post('/api/auth/password/reset', { token: tokenIn(mail.text, 'reset-password'), password: 'should-not-apply-1' });
    expect(res.status).toBe(410);
    expect((await new Client(env.app).signIn('trainer@larkspur.test', 'should-not-apply-1')).status).toBe(401);
  });
});

describe('the development mailbox', () => {
  it('lists the mail the fake receiver got, for admins', async () => {
    const admin = await signInAs(env.app, 'admin');
    const res = await admin.get('/api/shop/mail').expect(200);
    expect(res.body.length).toBeGreaterThan(0);
    expect(res.body[0]).toHaveProperty('subject');
  });
});
