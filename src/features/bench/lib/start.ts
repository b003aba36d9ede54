import { api } from '../../../lib/api-client';
import { commitLocal, saveVersion } from '../../../lib/offline/db';
import { flushOutbox } from '../../../lib/offline/outbox';
import type { BenchVersion, Meter, Vehicle } from '../api/types';

export interface StartForm {
  slug: string; vehicleId: string; meterId: string; complaint: string;
  engine: string; ambientC: string; startingMethod: string; batteryVolts: string;
}

const decimal = (s: string) => Number(s.replace(',', '.'));

/**
 * Starts a diagnosis: caches the pinned version on the phone, has the server check the start
 * while there is signal (so a typo cannot block the outbox later), and keeps it in IndexedDB.
 * Returns the new diagnosis id.
 */
export async function startDiagnosis(form: StartForm, vehicle: Vehicle | undefined, meter: Meter | undefined): Promise<string> {
  const version = await api.get<BenchVersion>(`/api/bench/procedures/${encodeURIComponent(form.slug)}`);
  await saveVersion(version);
  const id = crypto.randomUUID();
  const now = new Date().toISOString();
  await api.post('/api/diagnoses', {
    id, procedureVersionId: version.id, vehicleId: form.vehicleId, meterId: meter?.id ?? null, complaint: form.complaint, startedAt: now,
    conditions: { engine: form.engine, ambientC: decimal(form.ambientC), startingMethod: form.startingMethod, batteryVolts: form.batteryVolts ? decimal(form.batteryVolts) : null },
  });
  await commitLocal({
    id, versionId: version.id, procedureTitle: version.title, vehicleLabel: vehicle?.label ?? '', meterEntries: meter?.spec.entries ?? [],
    startedAt: now, rows: [], photos: [], status: 'active', updatedAt: now,
  }, []);
  void flushOutbox();
  return id;
}
