import { describe, expect, it } from 'vitest';
import { CURRENT_SCHEMA_VERSION, procedureDocumentSchema, stepSchema, upgradeProcedure, type UpgradeStep } from '@shared/schema';
import { branchesOf } from '@shared/engine/kinds';
import { doc, finding, ohmsReading, task } from '../fixtures';

const small = () => doc([task('start', 'coil'), ohmsReading('coil', 0.2, 1, { low: 'bad', ok: 'good', high: 'bad' }), finding('bad'), finding('good')]);

describe('procedure document schema', () => {
  it('fills in defaults an author may leave out', () => {
    const d = small();
    const coil = d.steps[1]!;
    expect(coil.kind).toBe('reading');
    if (coil.kind !== 'reading') return;
    expect(coil.decision).toBe('simple');
    expect(coil.borderline).toEqual({ action: 're-measure', attempts: 1 });
    expect(coil.safety).toEqual([]);
    expect(d.meta.minutesPerStep).toBe(2);
  });

  it('refuses a unit that does not belong to the quantity, naming the field', () => {
    const r = stepSchema.safeParse({ id: 'x', kind: 'reading', title: 'X', quantity: 'resistance', unit: 'V' });
    expect(r.success).toBe(false);
    expect(r.error?.issues[0]?.path).toEqual(['unit']);
  });

  it('refuses step ids a formula could not name', () => {
    expect(stepSchema.safeParse({ id: 'plug-gap', kind: 'task', title: 'X' }).success).toBe(false);
    expect(stepSchema.safeParse({ id: 'plugGap_2', kind: 'task', title: 'X' }).success).toBe(true);
  });

  it('lists the branches of each step kind with stable handles', () => {
    const d = small();
    expect(branchesOf(d.steps[0]!).map((b) => [b.handle, b.to])).toEqual([['next', 'coil']]);
    expect(branchesOf(d.steps[1]!).map((b) => b.handle)).toEqual(['band:low', 'band:ok', 'band:high']);
    expect(branchesOf(d.steps[2]!)).toEqual([]);
  });
});

describe('upgradeProcedure', () => {
  it('accepts a current document unchanged', () => {
    const d = small();
    const r = upgradeProcedure(JSON.parse(JSON.stringify(d)));
    expect(r.ok && r.document).toEqual(d);
  });

  it('refuses a document from a newer app, saying to update', () => {
    const r = upgradeProcedure({ ...small(), schemaVersion: CURRENT_SCHEMA_VERSION + 1 });
    expect(r.ok).toBe(false);
    expect(!r.ok && r.code).toBe('newer-version');
  });

  it('refuses a document without a schema version', () => {
    const r = upgradeProcedure({ meta: {} });
    expect(!r.ok && r.code).toBe('unknown-version');
  });

  it('applies each version step in order when upgrading an older document', () => {
    // A made-up chain 1 -> 2 -> 3 proves the mechanism; real steps get their own test when added.
    const seen: number[] = [];
    const chain: Record<number, UpgradeStep> = {
      1: (d) => { seen.push(1); return { ...d, renamed: true }; },
      2: (d) => { seen.push(2); return d; },
    };
    const r = upgradeProcedure({ ...JSON.parse(JSON.stringify(small())), schemaVersion: 1 }, chain, 3);
    expect(seen).toEqual([1, 2]);
    // Version 3 is not the current schema, so validation refuses it: nothing half-upgraded escapes.
    expect(!r.ok && r.code).toBe('invalid');
  });

  it('brings a version 1 document to version 2 unchanged but for the version, since a version 1 step has no pictures', () => {
    const v1 = { ...JSON.parse(JSON.stringify(small())), schemaVersion: 1 };
    const r = upgradeProcedure(v1);
    expect(r.ok && r.upgradedFrom).toBe(1);
    expect(r.ok && r.document).toEqual(small());
  });

  it('drops a pictures field found on a version 1 step, which cannot name a stored picture', () => {
    const v1 = { ...JSON.parse(JSON.stringify(small())), schemaVersion: 1 };
    v1.steps[0].pictures = [{ id: 'not-a-picture', caption: 'left by hand' }];
    const r = upgradeProcedure(v1);
    expect(r.ok).toBe(true);
    expect(r.ok && 'pictures' in r.document.steps[0]!).toBe(false);
  });

  it('keeps the order and captions of pictures on a version 2 step, and refuses one without a caption', () => {
    const d = JSON.parse(JSON.stringify(small()));
    const ids = ['0b0f8f0e-6a51-4f0e-9d0a-111111111111', '0b0f8f0e-6a51-4f0e-9d0a-222222222222'];
    d.steps[1].pictures = [{ id: ids[1], caption: 'Pulser lead, green/white' }, { id: ids[0], caption: 'Back-probe here' }];
    const r = upgradeProcedure(d);
    expect(r.ok && r.document.steps[1]!.pictures?.map((p) => p.id)).toEqual([ids[1], ids[0]]);
    d.steps[1].pictures[0].caption = '  ';
    const bad = upgradeProcedure(d);
    expect(!bad.ok && bad.error?.issues[0]?.path).toEqual(['steps', 1, 'pictures', 0, 'caption']);
  });

  it('round-trips through JSON without loss', () => {
    const d = small();
    expect(procedureDocumentSchema.parse(JSON.parse(JSON.stringify(d)))).toEqual(d);
  });
});
