import { randomUUID } from 'node:crypto';
import type { ShopWorld } from './authz-world';
import { fixtureDoc } from './debrief.fixture';

/**
 * A valid body for each JSON route: the fuzz test replaces one part of it at a time, so that the
 * hostile value gets past the fields around it and reaches the code behind the first check.
 */
export function exampleBodies(w: ShopWorld, email: string): Record<string, unknown> {
  const now = new Date().toISOString();
  const conditions = { engine: 'cold', ambientC: 18, startingMethod: 'kick', batteryVolts: 12.4 };
  return {
    'POST /api/auth/login': { email, password: 'a wrong password' },
    'POST /api/auth/shop': { shopId: w.shopId },
    'POST /api/auth/password/forgot': { email: 'nobody@matrix.test' },
    'POST /api/auth/password/reset': { token: 'not-a-real-token-value', password: 'a-new-long-password' },
    'POST /api/auth/invitations/accept': { token: 'not-a-real-token-value', name: 'New Member', password: 'a-new-long-password' },
    'POST /api/procedures/lint': { document: fixtureDoc() },
    'POST /api/readings/parse': { text: '4K7', quantity: 'resistance', unit: 'Ω' },
    'POST /api/diagnoses': {
      id: randomUUID(), procedureVersionId: w.versionId, vehicleId: w.vehicleId, meterId: w.meterId, complaint: 'Cranks but will not fire', conditions, startedAt: now,
    },
    'POST /api/diagnoses/:id/steps': {
      id: randomUUID(), after: null, stepId: 'prepare', entered: '0.5', leadEntered: '0.1', answerId: 'no', note: '', acknowledged: true,
      outcome: { partsFitted: [{ name: 'Stator', lot: 'L1' }], finalCheck: { spark: true, runs: true, stops: true }, labourMinutes: 30 }, startedAt: now, answeredAt: now,
    },
    'POST /api/diagnoses/:id/report': { to: 'desk@larkspur.test' },
    'POST /api/vehicles': { label: 'FZ-1', model: 'Wren 50', frameNumber: '1M8GDM9AXKP042788', hours: 12.5, notes: 'fuzz' },
    'PUT /api/vehicles/:id': { label: 'FZ-2', model: 'Wren 50', frameNumber: 'WRN50-0099', hours: 3, notes: '' },
    'POST /api/procedures': { meta: { title: 'Fuzz', symptom: 'No spark', ignitionSystem: 'magneto-cdi', minutesPerStep: 2 } },
    'POST /api/procedures/import': { file: { format: 'sparkwright-procedure', document: fixtureDoc() }, title: 'Fuzz import' },
    'POST /api/procedures/:id/duplicate': { title: 'Fuzz copy' },
    'POST /api/procedures/:id/archive': { archived: false },
    'POST /api/procedures/:id/drafts': { fromVersionId: w.versionId },
    'PUT /api/procedures/:id/versions/:versionId': { document: fixtureDoc(), lockVersion: 1 },
    'POST /api/procedures/:id/versions/:versionId/send-back': { comment: 'Add a band' },
    'POST /api/procedures/:id/versions/:versionId/comments': { body: 'Fuzz comment', stepId: 'prepare' },
    // multipart in the app; a JSON body never carries the picture, so every fuzzed request is refused before storage
    'POST /api/procedures/:id/versions/:versionId/pictures': { stepId: 'prepare' },
    'POST /api/debrief/diagnoses/:id/coaching-notes': { body: 'Fuzz note', stepId: 'prepare' },
    'POST /api/debrief/advisor/drafts': { versionId: w.versionId, order: ['pulserGap', 'exciter', 'killSwitch', 'coilPrimary'] },
    'PATCH /api/shop/members/:id': { roles: ['technician'] },
    'POST /api/shop/invitations': { email: 'fuzz-invitee@matrix.test', name: 'Fuzz', roles: ['technician'] },
    'PUT /api/shop/settings': { name: 'Larkspur Lane Powersports', settings: { comebackDays: 30, abandonAfterHours: 24, serviceDeskEmail: 'desk@larkspur.test' }, locale: 'de-DE' },
    'POST /api/shop/meters': { name: 'Fuzz meter', spec: { entries: [{ quantity: 'resistance', percentOfReading: 0.9, counts: 2, resolution: 0.1 }] } },
  };
}
