import type { ZodError } from 'zod';
import { CURRENT_SCHEMA_VERSION, procedureDocumentSchema, type ProcedureDocument } from './procedure';

/** Brings a stored document of version n to version n + 1. Pure; receives plain JSON. */
export type UpgradeStep = (doc: Record<string, unknown>) => Record<string, unknown>;

/**
 * Version 1 → 2: steps may carry reference pictures (`pictures: [{ id, caption }]`). A version 1
 * step never had any, so a `pictures` field found on one was not written by Sparkwright (a hand
 * edit, another tool) and names no stored picture: it is dropped rather than trusted.
 * Example: `{ id: 'coil', kind: 'task', pictures: 'x' }` → `{ id: 'coil', kind: 'task' }`.
 */
export function upgradeV1toV2(doc: Record<string, unknown>): Record<string, unknown> {
  if (!Array.isArray(doc.steps)) return doc;
  const steps = doc.steps.map((s: unknown) => {
    if (typeof s !== 'object' || s === null || !('pictures' in s)) return s;
    const { pictures: _dropped, ...rest } = s as Record<string, unknown>;
    return rest;
  });
  return { ...doc, steps };
}

/**
 * One entry per version step: `UPGRADES[n]` turns version n into n + 1, each with its own test
 * (tests/shared/schema/procedure.test.ts), so stored documents and old files keep loading.
 */
export const UPGRADES: Readonly<Record<number, UpgradeStep>> = { 1: upgradeV1toV2 };

export type UpgradeResult =
  | { ok: true; document: ProcedureDocument; upgradedFrom: number }
  | { ok: false; code: 'not-an-object' | 'unknown-version' | 'newer-version' | 'invalid'; message: string; error?: ZodError };

/**
 * Reads a stored procedure document of any known version and returns it in the current shape.
 * Example: `upgradeProcedure(JSON.parse(row.graph))` → `{ ok: true, document, upgradedFrom: 1 }`.
 */
export function upgradeProcedure(
  raw: unknown,
  upgrades: Readonly<Record<number, UpgradeStep>> = UPGRADES,
  target: number = CURRENT_SCHEMA_VERSION,
): UpgradeResult {
  if (typeof raw !== 'object' || raw === null || Array.isArray(raw)) {
    return { ok: false, code: 'not-an-object', message: 'A procedure document must be a JSON object.' };
  }
  let doc = raw as Record<string, unknown>;
  const from = doc.schemaVersion;
  if (typeof from !== 'number' || !Number.isInteger(from) || from < 1) {
    return { ok: false, code: 'unknown-version', message: 'The document has no valid schemaVersion (a whole number from 1).' };
  }
  if (from > target) {
    return {
      ok: false,
      code: 'newer-version',
      message: `The document is schema version ${from}, newer than this app understands (${target}); update the app.`,
    };
  }
  for (let v = from; v < target; v++) {
    const step = upgrades[v];
    if (!step) return { ok: false, code: 'unknown-version', message: `No upgrade is known from schema version ${v}.` };
    doc = { ...step(doc), schemaVersion: v + 1 };
  }
  const parsed = procedureDocumentSchema.safeParse(doc);
  if (!parsed.success) {
    return { ok: false, code: 'invalid', message: 'The document does not match the procedure schema.', error: parsed.error };
  }
  return { ok: true, document: parsed.data, upgradedFrom: from };
}
