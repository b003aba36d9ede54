import { api } from '../../../lib/api-client';
import { commitLocal, findVersionBySlug, getVersion, type LocalVersion } from '../../../lib/offline/db';
import { flushOutbox } from '../../../lib/offline/outbox';
import type { Conditions, StartDiagnosisBody } from '@shared/schema/bench';
import type { MeterDto } from '@shared/schema/shop';
import type { VehicleDto } from '@shared/schema/vehicle';
import { fetchVersion, isOffline } from './kit';

export interface StartForm {
  slug: string; vehicleId: string; meterId: string; complaint: string;
  engine: string; ambientC: string; startingMethod: string; batteryVolts: string;
}

const decimal = (s: string) => Number(s.replace(',', '.'));

/**
 * The version to start on. The one the start page's list names, when the phone keeps it already:
 * a published version never changes, so there is nothing to wait for (its branch frequencies are
 * fetched again once the first step is up, for the next start). Else the latest published
 * version from the server, and without signal the one kept on the phone.
 */
async function versionFor(slug: string, listedVersionId: string | undefined): Promise<LocalVersion> {
  const kept = listedVersionId ? await getVersion(listedVersionId) : undefined;
  if (kept) {
    setTimeout(() => void fetchVersion(slug).catch(() => undefined), 2000);
    return kept;
  }
  try {
    return await fetchVersion(slug);
  } catch (e) {
    const kept = isOffline(e) ? await findVersionBySlug(slug) : undefined;
    if (!kept) {
      throw isOffline(e)
        ? new Error('No signal, and this procedure has not been kept on this phone yet. Open the start page once where there is signal.')
        : e;
    }
    return kept;
  }
}

/**
 * Starts a diagnosis and keeps it in IndexedDB. With signal the server checks the start first, so
 * a mistake shows here rather than blocking the outbox later. Without signal the start waits in
 * the outbox ahead of the steps, and the diagnosis runs on the version kept on the phone.
 * `listedVersionId` is the version the procedure list names. Returns the new diagnosis id.
 */
export async function startDiagnosis(form: StartForm, vehicle: VehicleDto | undefined, meter: MeterDto | undefined, listedVersionId?: string): Promise<string> {
  const version = await versionFor(form.slug, listedVersionId);
  const id = crypto.randomUUID();
  const now = new Date().toISOString();
  const body: StartDiagnosisBody = {
    id, procedureVersionId: version.id, vehicleId: form.vehicleId, meterId: meter?.id ?? null, complaint: form.complaint, startedAt: now,
    // The form holds what the selects offer; the server checks the values against the same schema.
    conditions: { engine: form.engine as Conditions['engine'], ambientC: decimal(form.ambientC), startingMethod: form.startingMethod as Conditions['startingMethod'], batteryVolts: form.batteryVolts ? decimal(form.batteryVolts) : null },
  };
  let queued = false;
  try {
    await api.post('/api/diagnoses', body);
  } catch (e) {
    if (!isOffline(e)) throw e;
    queued = true;
  }
  await commitLocal({
    id, versionId: version.id, procedureTitle: version.title, vehicleLabel: vehicle?.label ?? '', meterEntries: meter?.spec.entries ?? [],
    startedAt: now, rows: [], photos: [], status: 'active', updatedAt: now,
  }, queued ? [{ kind: 'start', body }] : []);
  void flushOutbox();
  return id;
}
