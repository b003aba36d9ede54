import type { Role } from '@shared/schema/roles';
import { PERMISSIONS, may, readsDiagnoses } from '@shared/schema/role-names';

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
// The role sets come from the one permission policy the server checks (shared/schema/role-names.ts);
// this table says which of them each route follows, so a reviewer reads route → roles here.
const P = PERMISSIONS;
const ADMIN = P['shop.manage'];
const AUTHOR = P['procedure.author'];
const LEAD = P['procedure.review'];
const DRAFTING = P['procedure.draft'];
const BENCH_WORKERS = P['diagnosis.work'];
const VEHICLE_EDITORS = P['vehicle.edit'];
const ANALYSTS = P['analytics.read'];
const COACHES = P['coaching.write'];
const ADVICE_DRAFTERS = P['advice.draft'];
/** Anyone who reads diagnoses: their own (Bench workers) or the shop's (leads, trainers). */
const DIAGNOSIS_READERS: readonly Role[] = MEMBERS.filter((r) => readsDiagnoses([r]));
/**
 * The matrix's diagnosis is the technician's. An author works at the Bench too but reads and steps
 * only their own diagnoses, so to the author this one does not exist (404), like a foreign id.
 */
const NOT_THEIRS: readonly Role[] = MEMBERS.filter((r) => r !== 'technician' && !may([r], 'diagnosis.readAll') && !may([r], 'diagnosis.workAny'));

/** Members who neither open drafts nor work at the Bench: no picture is theirs to see. */
const PICTURE_BLIND: readonly Role[] = MEMBERS.filter((r) => !may([r], 'procedure.draft') && !may([r], 'diagnosis.work'));

export const POLICY: Readonly<Record<string, Rule>> = {
  'GET /api/health': { may: 'anyone' },

  // Auth: open doors, and the account's own session
  'GET /api/auth/csrf': { may: 'anyone' },
  'POST /api/auth/login': { may: 'anyone' },
  'POST /api/auth/logout': { may: 'anyone' },
  'GET /api/auth/me': { may: 'signed-in' },
  // who is signed in, or { user: null }: the app's first question, answered to anyone
  'GET /api/auth/session': { may: 'anyone' },
  'POST /api/auth/shop': { may: 'signed-in' },
  'POST /api/auth/password/forgot': { may: 'anyone' },
  'POST /api/auth/password/reset': { may: 'anyone' },
  'GET /api/auth/invitations/:token': { may: 'anyone' },
  'POST /api/auth/invitations/accept': { may: 'anyone' },

  // The engine over HTTP: pure computations for any signed-in account
  'POST /api/procedures/lint': { may: 'signed-in' },
  'POST /api/readings/parse': { may: 'signed-in' },

  // Bench
  'GET /api/diagnoses': { may: DIAGNOSIS_READERS },
  'POST /api/diagnoses': { may: BENCH_WORKERS },
  'GET /api/diagnoses/:id': { may: DIAGNOSIS_READERS, hidden: NOT_THEIRS },
  'POST /api/diagnoses/:id/steps': { may: BENCH_WORKERS, hidden: NOT_THEIRS },
  'POST /api/diagnoses/:id/report': { may: DIAGNOSIS_READERS, hidden: NOT_THEIRS },
  'GET /api/bench/procedures': { may: MEMBERS },
  'GET /api/bench/procedures/:slug': { may: MEMBERS },
  'GET /api/bench/versions/:id': { may: MEMBERS },
  'POST /api/attachments': { may: BENCH_WORKERS, hidden: NOT_THEIRS },
  'GET /api/attachments/:id': { may: DIAGNOSIS_READERS, hidden: NOT_THEIRS },
  'GET /api/attachments/:id/thumb': { may: DIAGNOSIS_READERS, hidden: NOT_THEIRS },
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
  'POST /api/procedures/:id/versions/:versionId/pictures': { may: AUTHOR },
  // a step's reference pictures: the matrix's picture is named by the published version, so Bench
  // workers and drafting members see it; to anyone else it does not exist (404, like a foreign id)
  'GET /api/pictures/:id/:size': { may: MEMBERS, hidden: PICTURE_BLIND },

  // Debrief: the replay and the list follow the same diagnosis readers as the Bench's record
  'GET /api/debrief/procedures': { may: ANALYSTS },
  'GET /api/debrief/technicians': { may: ANALYSTS },
  'GET /api/debrief/diagnoses': { may: DIAGNOSIS_READERS },
  'GET /api/debrief/diagnoses.csv': { may: DIAGNOSIS_READERS },
  'GET /api/debrief/diagnoses/:id': { may: DIAGNOSIS_READERS, hidden: NOT_THEIRS },
  'POST /api/debrief/diagnoses/:id/coaching-notes': { may: COACHES },
  'GET /api/debrief/analytics/steps': { may: ANALYSTS },
  'GET /api/debrief/analytics/findings': { may: ANALYSTS },
  'GET /api/debrief/analytics/readings': { may: ANALYSTS },
  'GET /api/debrief/analytics/times': { may: ANALYSTS },
  'GET /api/debrief/analytics/advisor': { may: ANALYSTS },
  'POST /api/debrief/advisor/drafts': { may: ADVICE_DRAFTERS },

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
