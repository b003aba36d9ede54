import { randomUUID } from 'node:crypto';
import type request from 'supertest';
import type { Client } from './harness';
import type { ShopWorld } from './authz-world';
import { fixtureDoc } from './debrief.fixture';
import { TINY_PNG } from './bench-fixtures';

/** What a request of the matrix may use: the caller's agent, the shop it points at, and helpers. */
export interface CellContext {
  c: Client;
  w: ShopWorld;
  /** a second session of the same caller, for routes that end or replace the session they run in */
  spare(): Promise<Client>;
  email: string;
  invitationToken(): Promise<string>;
  resetToken(): Promise<string>;
}

type Send = (x: CellContext) => Promise<request.Response> | request.Test;
/** `foreign`: the route names a record (in its path or body), so it also runs against another shop's. */
export interface CellRequest { send: Send; foreign?: boolean }

const q = (w: ShopWorld) => `procedureId=${w.procedureId}&versionId=${w.versionId}`;
const doc = () => fixtureDoc();
const now = () => new Date().toISOString();
const startBody = (w: ShopWorld) => ({
  id: randomUUID(), procedureVersionId: w.versionId, vehicleId: w.vehicleId, meterId: null, complaint: 'Cranks but will not fire',
  conditions: { engine: 'cold', ambientC: 18, startingMethod: 'kick', batteryVolts: null }, startedAt: now(),
});
const versionUrl = (v: { procedureId: string; versionId: string }, tail = '') => `/api/procedures/${v.procedureId}/versions/${v.versionId}${tail}`;
const tag = () => randomUUID().slice(0, 8);

/** One request per route, sent by every actor at its own shop's records and at a foreign shop's. */
export const REQUESTS: Readonly<Record<string, CellRequest>> = {
  'GET /api/health': { send: ({ c }) => c.get('/api/health') },
  'GET /api/auth/csrf': { send: ({ c }) => c.get('/api/auth/csrf') },
  'POST /api/auth/login': {
    send: async ({ spare, email }) => {
      const s = await spare();
      await s.fetchCsrf();
      return s.post('/api/auth/login', { email, password: 'spark-demo-test-pw' });
    },
  },
  'POST /api/auth/logout': { send: async ({ spare }) => (await spare()).post('/api/auth/logout') },
  'GET /api/auth/me': { send: ({ c }) => c.get('/api/auth/me') },
  'GET /api/auth/session': { send: ({ c }) => c.get('/api/auth/session') },
  'POST /api/auth/shop': { send: ({ c, w }) => c.post('/api/auth/shop', { shopId: w.shopId }), foreign: true },
  'POST /api/auth/password/forgot': { send: ({ c }) => c.post('/api/auth/password/forgot', { email: 'nobody@matrix.test' }) },
  'POST /api/auth/password/reset': { send: async ({ c, resetToken }) => c.post('/api/auth/password/reset', { token: await resetToken(), password: 'a-new-long-password' }) },
  'GET /api/auth/invitations/:token': { send: async ({ c, invitationToken }) => c.get(`/api/auth/invitations/${await invitationToken()}`) },
  'POST /api/auth/invitations/accept': {
    send: async ({ spare, invitationToken }) => (await spare()).post('/api/auth/invitations/accept', { token: await invitationToken(), name: 'New Member', password: 'a-new-long-password' }),
  },
  'POST /api/procedures/lint': { send: ({ c }) => c.post('/api/procedures/lint', { document: doc() }) },
  'POST /api/readings/parse': { send: ({ c }) => c.post('/api/readings/parse', { text: '4K7', quantity: 'resistance' }) },

  'GET /api/diagnoses': { send: ({ c }) => c.get('/api/diagnoses') },
  'POST /api/diagnoses': { send: ({ c, w }) => c.post('/api/diagnoses', startBody(w)), foreign: true },
  'GET /api/diagnoses/:id': { send: ({ c, w }) => c.get(`/api/diagnoses/${w.diagnosisId}`), foreign: true },
  'POST /api/diagnoses/:id/steps': {
    send: async ({ c, w }) => c.post(`/api/diagnoses/${await w.fresh.diagnosis()}/steps`, { id: randomUUID(), after: null, stepId: 'prepare', startedAt: now(), answeredAt: now() }),
    foreign: true,
  },
  'POST /api/diagnoses/:id/report': { send: ({ c, w }) => c.post(`/api/diagnoses/${w.diagnosisId}/report`, {}), foreign: true },
  'GET /api/bench/procedures': { send: ({ c }) => c.get('/api/bench/procedures') },
  'GET /api/bench/procedures/:slug': { send: ({ c, w }) => c.get(`/api/bench/procedures/${w.slug}`), foreign: true },
  'GET /api/bench/versions/:id': { send: ({ c, w }) => c.get(`/api/bench/versions/${w.versionId}`), foreign: true },
  'POST /api/attachments': {
    send: async ({ c, w }) => c.agent.post('/api/attachments').set('X-CSRF-Token', c.csrf)
      .field('id', randomUUID()).field('diagnosisId', w.diagnosisId).attach('photo', TINY_PNG, 'photo.png'),
    foreign: true,
  },
  'GET /api/attachments/:id': { send: ({ c, w }) => c.get(`/api/attachments/${w.attachmentId}`), foreign: true },
  'GET /api/attachments/:id/thumb': { send: ({ c, w }) => c.get(`/api/attachments/${w.attachmentId}/thumb`), foreign: true },
  'GET /api/vehicles': { send: ({ c }) => c.get('/api/vehicles') },
  'GET /api/vehicles/:id': { send: ({ c, w }) => c.get(`/api/vehicles/${w.vehicleId}`), foreign: true },
  'POST /api/vehicles': { send: ({ c }) => c.post('/api/vehicles', { label: `MX-${tag()}`, model: 'Badger 110' }) },
  'PUT /api/vehicles/:id': { send: ({ c, w }) => c.put(`/api/vehicles/${w.vehicleId}`, { label: `MX-${tag()}`, model: 'Wren 50' }), foreign: true },

  'GET /api/procedures': { send: ({ c }) => c.get('/api/procedures') },
  'POST /api/procedures': { send: ({ c }) => c.post('/api/procedures', { meta: { title: `Matrix ${tag()}`, symptom: 'No spark', ignitionSystem: 'magneto-cdi' } }) },
  'POST /api/procedures/import': {
    send: ({ c }) => c.post('/api/procedures/import', { file: { format: 'sparkwright-procedure', document: doc() }, title: `Imported ${tag()}` }),
  },
  'GET /api/procedures/:id': { send: ({ c, w }) => c.get(`/api/procedures/${w.procedureId}`), foreign: true },
  'POST /api/procedures/:id/duplicate': { send: ({ c, w }) => c.post(`/api/procedures/${w.procedureId}/duplicate`, { title: `Copy ${tag()}` }), foreign: true },
  'POST /api/procedures/:id/archive': { send: ({ c, w }) => c.post(`/api/procedures/${w.procedureId}/archive`, { archived: false }), foreign: true },
  'POST /api/procedures/:id/drafts': {
    send: async ({ c, w }) => c.post(`/api/procedures/${(await w.fresh.version('published')).procedureId}/drafts`, {}), foreign: true,
  },
  'GET /api/procedures/:id/versions/:versionId': { send: ({ c, w }) => c.get(versionUrl(w)), foreign: true },
  'PUT /api/procedures/:id/versions/:versionId': {
    send: async ({ c, w }) => c.put(versionUrl(await w.fresh.version('draft')), { document: doc(), lockVersion: 1 }), foreign: true,
  },
  'POST /api/procedures/:id/versions/:versionId/submit': { send: async ({ c, w }) => c.post(versionUrl(await w.fresh.version('draft'), '/submit')), foreign: true },
  'POST /api/procedures/:id/versions/:versionId/take-back': { send: async ({ c, w }) => c.post(versionUrl(await w.fresh.version('in_review'), '/take-back')), foreign: true },
  'POST /api/procedures/:id/versions/:versionId/send-back': {
    send: async ({ c, w }) => c.post(versionUrl(await w.fresh.version('in_review'), '/send-back'), { comment: 'Add the open-winding band.' }), foreign: true,
  },
  'POST /api/procedures/:id/versions/:versionId/publish': { send: async ({ c, w }) => c.post(versionUrl(await w.fresh.version('in_review'), '/publish')), foreign: true },
  'POST /api/procedures/:id/versions/:versionId/retire': { send: async ({ c, w }) => c.post(versionUrl(await w.fresh.version('published'), '/retire')), foreign: true },
  'GET /api/procedures/:id/versions/:versionId/export': { send: ({ c, w }) => c.get(versionUrl(w, '/export')), foreign: true },
  'GET /api/procedures/:id/versions/:versionId/comments': { send: ({ c, w }) => c.get(versionUrl(w, '/comments')), foreign: true },
  'POST /api/procedures/:id/versions/:versionId/pictures': {
    send: async ({ c, w }) => c.agent.post(versionUrl(await w.fresh.version('draft'), '/pictures')).set('X-CSRF-Token', c.csrf)
      .field('stepId', 'prepare').attach('picture', TINY_PNG, 'pins.png'),
    foreign: true,
  },
  'GET /api/pictures/:id/:size': { send: ({ c, w }) => c.get(`/api/pictures/${w.pictureId}/phone`), foreign: true },
  'POST /api/procedures/:id/versions/:versionId/comments': { send: ({ c, w }) => c.post(versionUrl(w, '/comments'), { body: 'Matrix comment' }), foreign: true },

  'GET /api/debrief/procedures': { send: ({ c }) => c.get('/api/debrief/procedures') },
  'GET /api/debrief/technicians': { send: ({ c }) => c.get('/api/debrief/technicians') },
  'GET /api/debrief/diagnoses': { send: ({ c }) => c.get('/api/debrief/diagnoses') },
  'GET /api/debrief/diagnoses.csv': { send: ({ c }) => c.get('/api/debrief/diagnoses.csv') },
  'GET /api/debrief/diagnoses/:id': { send: ({ c, w }) => c.get(`/api/debrief/diagnoses/${w.diagnosisId}`), foreign: true },
  'POST /api/debrief/diagnoses/:id/coaching-notes': { send: ({ c, w }) => c.post(`/api/debrief/diagnoses/${w.diagnosisId}/coaching-notes`, { body: 'Check the plug cap first.' }), foreign: true },
  'GET /api/debrief/analytics/steps': { send: ({ c, w }) => c.get(`/api/debrief/analytics/steps?${q(w)}`), foreign: true },
  'GET /api/debrief/analytics/findings': { send: ({ c, w }) => c.get(`/api/debrief/analytics/findings?${q(w)}`), foreign: true },
  'GET /api/debrief/analytics/readings': { send: ({ c, w }) => c.get(`/api/debrief/analytics/readings?${q(w)}`), foreign: true },
  'GET /api/debrief/analytics/times': { send: ({ c, w }) => c.get(`/api/debrief/analytics/times?${q(w)}`), foreign: true },
  'GET /api/debrief/analytics/advisor': { send: ({ c, w }) => c.get(`/api/debrief/analytics/advisor?${q(w)}`), foreign: true },
  'POST /api/debrief/advisor/drafts': {
    // the fixture's chain of four independent checks, in another order
    send: async ({ c, w }) => c.post('/api/debrief/advisor/drafts', { versionId: (await w.fresh.version('published')).versionId, order: ['pulserGap', 'exciter', 'killSwitch', 'coilPrimary'] }),
    foreign: true,
  },

  'GET /api/shop/members': { send: ({ c }) => c.get('/api/shop/members') },
  'PATCH /api/shop/members/:id': { send: ({ c, w }) => c.patch(`/api/shop/members/${w.memberId}`, { roles: ['technician'] }), foreign: true },
  'POST /api/shop/members/:id/disable': { send: async ({ c, w }) => c.post(`/api/shop/members/${await w.fresh.member()}/disable`), foreign: true },
  'POST /api/shop/members/:id/enable': { send: ({ c, w }) => c.post(`/api/shop/members/${w.memberId}/enable`), foreign: true },
  'DELETE /api/shop/members/:id': { send: async ({ c, w }) => c.delete(`/api/shop/members/${await w.fresh.member()}`), foreign: true },
  'GET /api/shop/invitations': { send: ({ c }) => c.get('/api/shop/invitations') },
  'POST /api/shop/invitations': { send: ({ c }) => c.post('/api/shop/invitations', { email: `invitee-${tag()}@matrix.test`, roles: ['technician'] }) },
  'DELETE /api/shop/invitations/:id': { send: async ({ c, w }) => c.delete(`/api/shop/invitations/${await w.fresh.invitation()}`), foreign: true },
  'GET /api/shop/settings': { send: ({ c }) => c.get('/api/shop/settings') },
  'PUT /api/shop/settings': {
    send: ({ c }) => c.put('/api/shop/settings', { name: 'Larkspur Lane Powersports', settings: { comebackDays: 30, abandonAfterHours: 24, serviceDeskEmail: 'desk@larkspur.test' } }),
  },
  'GET /api/shop/meters': { send: ({ c }) => c.get('/api/shop/meters') },
  'POST /api/shop/meters': { send: ({ c }) => c.post('/api/shop/meters', { name: `Meter ${tag()}`, spec: { entries: [] } }) },
  'GET /api/shop/mail': { send: ({ c }) => c.get('/api/shop/mail') },
};
