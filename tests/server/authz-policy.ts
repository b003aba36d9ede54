import type { Role } from '@shared/schema/roles';

/**
 * Who may call each API route: the policy a reviewer reads, and the authorization matrix checks
 * cell by cell (tests/server/authz-matrix.test.ts).
 *
 * - `may`: who gets a 2xx in their own shop: `anyone` (signed out too), `signed-in` (any account,
 *   shop or not), or the roles. Signed out, every other route answers 401; a signed-in role not
 *   listed answers 403.
 * - `hidden`: roles that pass the role check but for whom the record is not theirs to see; they get
 *   404, exactly like a foreign id (a technician reads only the diagnoses they ran).
 * - A foreign shop's id answers 404 to every role that may, and 403 to the others (the role check
 *   comes first, so a refused role learns nothing about ids either).
 */
export interface Rule { may: 'anyone' | 'signed-in' | readonly Role[]; hidden?: readonly Role[] }

const MEMBERS: readonly Role[] = ['admin', 'author', 'lead', 'technician', 'trainer'];
const ADMIN: readonly Role[] = ['admin'];
const AUTHOR: readonly Role[] = ['author'];
const LEAD: readonly Role[] = ['lead'];
const DRAFTING: readonly Role[] = ['author', 'lead'];
const BENCH_WORKERS: readonly Role[] = ['technician', 'lead'];
const VEHICLE_EDITORS: readonly Role[] = ['admin', 'lead', 'technician'];
const ANALYSTS: readonly Role[] = ['trainer', 'lead'];
const DEBRIEF_READERS: readonly Role[] = ['trainer', 'lead', 'technician'];
/**
 * The Bench's record of a diagnosis: leads, trainers and admins read every one; a technician
 * their own. An author is a member but not a reader: 404.
 * Disagrees with the Debrief replay below, where an admin gets 403 (issue 17 point 3 makes one
 * policy of the two; until it lands the matrix states each route as it answers today).
 */
const RECORD_READERS: readonly Role[] = MEMBERS;
const NOT_READERS: readonly Role[] = ['author'];

export const POLICY: Readonly<Record<string, Rule>> = {
  'GET /api/health': { may: 'anyone' },

  // Auth: open doors, and the account's own session
  'GET /api/auth/csrf': { may: 'anyone' },
  'POST /api/auth/login': { may: 'anyone' },
  'POST /api/auth/logout': { may: 'anyone' },
  'GET /api/auth/me': { may: 'signed-in' },
  'POST /api/auth/shop': { may: 'signed-in' },
  'POST /api/auth/password/forgot': { may: 'anyone' },
  'POST /api/auth/password/reset': { may: 'anyone' },
  'GET /api/auth/invitations/:token': { may: 'anyone' },
  'POST /api/auth/invitations/accept': { may: 'anyone' },

  // The engine over HTTP: pure computations for any signed-in account
  'POST /api/procedures/lint': { may: 'signed-in' },
  'POST /api/readings/parse': { may: 'signed-in' },

  // Bench
  'GET /api/diagnoses': { may: MEMBERS },
  'POST /api/diagnoses': { may: BENCH_WORKERS },
  'GET /api/diagnoses/:id': { may: RECORD_READERS, hidden: NOT_READERS },
  'POST /api/diagnoses/:id/steps': { may: BENCH_WORKERS },
  'POST /api/diagnoses/:id/report': { may: RECORD_READERS, hidden: NOT_READERS },
  'GET /api/bench/procedures': { may: MEMBERS },
  'GET /api/bench/procedures/:slug': { may: MEMBERS },
  'GET /api/bench/versions/:id': { may: MEMBERS },
  'POST /api/attachments': { may: BENCH_WORKERS },
  'GET /api/attachments/:id': { may: RECORD_READERS, hidden: NOT_READERS },
  'GET /api/attachments/:id/thumb': { may: RECORD_READERS, hidden: NOT_READERS },
  'GET /api/vehicles': { may: MEMBERS },
  'GET /api/vehicles/:id': { may: MEMBERS },
  'POST /api/vehicles': { may: VEHICLE_EDITORS },
  'PUT /api/vehicles/:id': { may: VEHICLE_EDITORS },

  // Drafting
  'GET /api/procedures': { may: MEMBERS },
  'POST /api/procedures': { may: AUTHOR },
  'POST /api/procedures/import': { may: AUTHOR },
  'GET /api/procedures/:id': { may: MEMBERS },
  'POST /api/procedures/:id/duplicate': { may: AUTHOR },
  'POST /api/procedures/:id/archive': { may: DRAFTING },
  'POST /api/procedures/:id/drafts': { may: AUTHOR },
  'GET /api/procedures/:id/versions/:versionId': { may: MEMBERS },
  'PUT /api/procedures/:id/versions/:versionId': { may: AUTHOR },
  'POST /api/procedures/:id/versions/:versionId/submit': { may: AUTHOR },
  'POST /api/procedures/:id/versions/:versionId/take-back': { may: AUTHOR },
  'POST /api/procedures/:id/versions/:versionId/send-back': { may: LEAD },
  'POST /api/procedures/:id/versions/:versionId/publish': { may: LEAD },
  'POST /api/procedures/:id/versions/:versionId/retire': { may: LEAD },
  'GET /api/procedures/:id/versions/:versionId/export': { may: MEMBERS },
  'GET /api/procedures/:id/versions/:versionId/comments': { may: DRAFTING },
  'POST /api/procedures/:id/versions/:versionId/comments': { may: DRAFTING },

  // Debrief. Today an admin may read a diagnosis's record on the Bench (above) but not its replay
  // here (403): the disagreement issue 17 point 3 settles.
  'GET /api/debrief/procedures': { may: ANALYSTS },
  'GET /api/debrief/technicians': { may: ANALYSTS },
  'GET /api/debrief/diagnoses': { may: DEBRIEF_READERS },
  'GET /api/debrief/diagnoses.csv': { may: DEBRIEF_READERS },
  'GET /api/debrief/diagnoses/:id': { may: DEBRIEF_READERS },
  'POST /api/debrief/diagnoses/:id/coaching-notes': { may: ANALYSTS },
  'GET /api/debrief/analytics/steps': { may: ANALYSTS },
  'GET /api/debrief/analytics/findings': { may: ANALYSTS },
  'GET /api/debrief/analytics/readings': { may: ANALYSTS },
  'GET /api/debrief/analytics/times': { may: ANALYSTS },
  'GET /api/debrief/analytics/advisor': { may: ANALYSTS },
  'POST /api/debrief/advisor/drafts': { may: LEAD },

  // Shop
  'GET /api/shop/members': { may: ADMIN },
  'PATCH /api/shop/members/:id': { may: ADMIN },
  'DELETE /api/shop/members/:id': { may: ADMIN },
  'POST /api/shop/members/:id/disable': { may: ADMIN },
  'POST /api/shop/members/:id/enable': { may: ADMIN },
  'GET /api/shop/invitations': { may: ADMIN },
  'POST /api/shop/invitations': { may: ADMIN },
  'DELETE /api/shop/invitations/:id': { may: ADMIN },
  'GET /api/shop/settings': { may: MEMBERS },
  'PUT /api/shop/settings': { may: ADMIN },
  'GET /api/shop/meters': { may: MEMBERS },
  'POST /api/shop/meters': { may: ADMIN },
  'GET /api/shop/mail': { may: ADMIN },
};

export const ACTORS = ['anonymous', 'admin', 'author', 'lead', 'technician', 'trainer'] as const;
export type Actor = (typeof ACTORS)[number];

/** What one cell should answer: 'ok' is any 2xx. */
export function expected(rule: Rule, actor: Actor, target: 'own' | 'foreign'): 'ok' | 401 | 403 | 404 {
  if (actor === 'anonymous') return rule.may === 'anyone' ? (target === 'own' ? 'ok' : 404) : 401;
  const allowed = rule.may === 'anyone' || rule.may === 'signed-in' || rule.may.includes(actor);
  if (!allowed) return 403;
  if (target === 'foreign' || rule.hidden?.includes(actor)) return 404;
  return 'ok';
}
