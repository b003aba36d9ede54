import { z } from 'zod';

/** The five roles a shop member may hold; one person may hold several. */
export const ROLES = ['admin', 'author', 'lead', 'technician', 'trainer'] as const;
export const RoleSchema = z.enum(ROLES);
export type Role = z.infer<typeof RoleSchema>;

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
