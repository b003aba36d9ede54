/**
 * The five roles a shop member may hold, and the areas each may open. Kept free of zod so the
 * app shell can use it without pulling the schema library into the first download.
 */
export const ROLES = ['admin', 'author', 'lead', 'technician', 'trainer'] as const;
export type Role = (typeof ROLES)[number];

/** Which areas each role may open. Server routes check roles themselves; this drives the UI. */
export const AREA_ROLES = {
  bench: ['technician', 'lead', 'author'],
  drafting: ['author', 'lead'],
  debrief: ['trainer', 'lead'],
  shop: ['admin'],
} as const satisfies Record<string, readonly Role[]>;
export type Area = keyof typeof AREA_ROLES;

/** True when any of `held` appears in `allowed`. Example: hasAnyRole(['technician'], ['lead']) === false */
export function hasAnyRole(held: readonly Role[], allowed: readonly Role[]): boolean {
  return held.some((r) => allowed.includes(r));
}
