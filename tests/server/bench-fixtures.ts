import { randomUUID } from 'node:crypto';
import { readdirSync, statSync } from 'node:fs';
import path from 'node:path';
import { doc, finding, handoff, ohmsReading, observation, task } from '../shared/fixtures';
import { Meter, Procedure, ProcedureVersion, Shop, Vehicle } from '../../server/models';
import { afterAll, beforeAll } from 'vitest';
import { signInAs, startTestApp, type Client, type TestEnv } from './harness';
import type { StepInput } from '@shared/schema';
import type { StartDiagnosisBody } from '@shared/schema/bench';

/**
 * A small published procedure with every step kind, so the Bench API tests do not depend on the
 * demo content. Limits are invented for the test.
 */
export const benchDoc = doc([
  { ...task('killLead', 'sparkTest'), safety: [{ signal: 'WARNING', text: 'Keep clear of the plug lead while cranking.' }] },
  observation('sparkTest', { none: 'exciter', strong: 'plugFinding', weak: 'senior' }),
  ohmsReading('exciter', 100, 200, { low: 'coilFinding', ok: 'pulser', high: 'coilFinding' }),
  {
    ...ohmsReading('pulser', 50, 170, { low: 'coilFinding', ok: 'combined', high: 'coilFinding' }), leadNull: true,
    safety: [{ signal: 'DANGER', text: 'Test text: the charge circuit is live while cranking.' }],
  } as StepInput,
  { id: 'combined', kind: 'formula', title: 'Combined', expression: 'parallel(exciter, pulser)', quantity: 'resistance', unit: 'Ω', next: 'cdiFinding' },
  { ...finding('cdiFinding', 'Replace the CDI unit'), parts: [{ name: 'CDI unit', quantity: 1 }] } as StepInput,
  finding('coilFinding', 'Replace the stator'),
  finding('plugFinding', 'Clean the plug'),
  handoff('senior'),
]);

export interface BenchWorld { versionId: string; vehicleId: string; meterId: string; shopId: string }

/** Publishes benchDoc as version 1 in the demo shop and returns the ids a diagnosis needs. */
export async function publishBenchProcedure(): Promise<BenchWorld> {
  const shop = (await Shop.findOne({ where: { slug: 'larkspur-lane' } }))!;
  const proc = await Procedure.create({ shopId: shop.id, slug: 'bench-test', title: 'Bench test procedure', symptom: 'No spark', ignitionSystem: 'magneto-cdi', archivedAt: null, createdBy: null });
  const version = await ProcedureVersion.create({
    shopId: shop.id, procedureId: proc.id, number: 1, status: 'published', document: benchDoc as unknown as Record<string, unknown>,
    basedOnId: null, createdBy: null, updatedBy: null, publishedBy: null, publishedAt: new Date(), retiredAt: null,
  });
  const vehicle = (await Vehicle.findOne({ where: { shopId: shop.id, label: 'W-01' } }))!;
  const meter = (await Meter.findOne({ where: { shopId: shop.id, name: 'Bench meter 1' } }))!;
  return { versionId: version.id, vehicleId: vehicle.id, meterId: meter.id, shopId: shop.id };
}

/**
 * A Bench API suite's world, filled before its tests: a test app on the real PostgreSQL, benchDoc
 * published, a signed-in technician; the app closes after them.
 */
export function benchSuite(): { readonly env: TestEnv; readonly tech: Client; readonly world: BenchWorld } {
  const s = {} as { env: TestEnv; tech: Client; world: BenchWorld };
  beforeAll(async () => {
    s.env = await startTestApp();
    s.world = await publishBenchProcedure();
    s.tech = await signInAs(s.env.app, 'tech');
  });
  afterAll(async () => s.env?.close());
  return s;
}

export function startBody(w: BenchWorld, id = randomUUID()): StartDiagnosisBody & { id: string } {
  return {
    id, procedureVersionId: w.versionId, vehicleId: w.vehicleId, meterId: w.meterId,
    complaint: 'Cranks but will not fire', conditions: { engine: 'cold', ambientC: 18, startingMethod: 'kick', batteryVolts: null },
    startedAt: new Date().toISOString(),
  };
}

export function stepBody(stepId: string, after: string | null, extra: Record<string, unknown> = {}) {
  const now = new Date().toISOString();
  return { id: randomUUID(), after, stepId, startedAt: now, answeredAt: now, ...extra };
}

/** Files in the fake S3 folder, to prove a refused upload stored nothing. */
export function storedObjectCount(env: TestEnv): number {
  const dir = path.join(env.runtime.deps.config.DATA_DIR, 's3');
  let n = 0;
  const walk = (d: string) => {
    for (const name of readdirSync(d)) {
      const p = path.join(d, name);
      if (statSync(p).isDirectory()) walk(p);
      else if (name.endsWith('._S3rver_object')) n++;
    }
  };
  walk(dir);
  return n;
}

/** A 1×1 PNG (the smallest valid picture) for upload tests. */
export const TINY_PNG = Buffer.from('iVBORw0KGgoAAAANSUhEUgAAAAEAAAABCAYAAAAfFcSJAAAADUlEQVR42mNk+M9QDwADhgGAWjR9awAAAABJRU5ErkJggg==', 'base64');
