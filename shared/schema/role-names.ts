/**
 * The five roles a shop member may hold, and the one permission policy over them: the server
 * checks every request with it (server/auth/policy.ts) and the app's guards read the same table.
 * Kept free of zod so the app shell can use it without pulling the schema library into the first
 * download.
 */
export const ROLES = ['admin', 'author', 'lead', 'technician', 'trainer'] as const;
export type Role = (typeof ROLES)[number];

const BENCH_WORKERS = ['technician', 'lead', 'author'] as const satisfies readonly Role[];
const SHOP_READERS = ['lead', 'trainer'] as const satisfies readonly Role[];

/**
 * Who may do what. A new permission goes here, with the server check beside the route or service
 * that needs it (`allow(...)` / `demand(...)` in server/auth/policy.ts).
 */
export const PERMISSIONS = {
  /** Start diagnoses, record their steps and photos; read their own diagnoses. */
  'diagnosis.work': BENCH_WORKERS,
  /** Record steps and photos on a colleague's diagnosis too (taking over at the bench). */
  'diagnosis.workAny': ['lead'],
  /** Read every diagnosis of the shop, not only their own. */
  'diagnosis.readAll': SHOP_READERS,
  /** Debrief's analytics, its procedure and technician lists, and the check-order advisor. */
  'analytics.read': SHOP_READERS,
  'coaching.write': SHOP_READERS,
  /** Turn a proposed check order into a draft. */
  'advice.draft': ['lead'],
  /** Create, import, copy, edit and send drafts for review. */
  'procedure.author': ['author'],
  /** Comment on, send back, publish and retire versions. */
  'procedure.review': ['lead'],
  /** See drafts and versions in review, their comments; archive a procedure. */
  'procedure.draft': ['author', 'lead'],
  'vehicle.edit': ['admin', ...BENCH_WORKERS],
  /** Members, roles, invitations, settings, meters, the mailbox. */
  'shop.manage': ['admin'],
} as const satisfies Record<string, readonly Role[]>;
export type Permission = keyof typeof PERMISSIONS;

/** Which areas each role may open: each area follows the permission its pages need. */
export const AREA_ROLES = {
  bench: PERMISSIONS['diagnosis.work'],
  drafting: PERMISSIONS['procedure.draft'],
  debrief: PERMISSIONS['analytics.read'],
  shop: PERMISSIONS['shop.manage'],
} as const satisfies Record<string, readonly Role[]>;
export type Area = keyof typeof AREA_ROLES;

/** True when any of `held` appears in `allowed`. Example: hasAnyRole(['technician'], ['lead']) === false */
export function hasAnyRole(held: readonly Role[], allowed: readonly Role[]): boolean {
  return held.some((r) => allowed.includes(r));
}

/** True when the roles grant the permission. Example: may(['trainer'], 'coaching.write') === true */
export function may(held: readonly Role[], permission: Permission): boolean {
  return hasAnyRole(held, PERMISSIONS[permission]);
}

/** Reading diagnoses at all: their own (Bench workers) or the shop's (leads, trainers). */
export function readsDiagnoses(held: readonly Role[]): boolean {
  return may(held, 'diagnosis.work') || may(held, 'diagnosis.readAll');
}
