import { api } from '../../../lib/api-client';
import { commitLocal, getVersion, saveVersion, type LocalRow } from '../../../lib/offline/db';
import { keepPictures } from '../../../lib/offline/pictures';
import type { BenchVersion, DiagnosisRecord } from '@shared/schema/bench';
import { enteredOf } from '@shared/engine/step-entry';

/**
 * Brings a diagnosis started on another phone onto this one: the pinned version and the answers
 * on its current path (the server already holds them, so nothing goes to the outbox).
 */
export async function resumeFromServer(id: string): Promise<void> {
  const record = await api.get<DiagnosisRecord>(`/api/diagnoses/${id}`);
  let version = await getVersion(record.versionId);
  if (!version) await saveVersion(version = await api.get<BenchVersion>(`/api/bench/versions/${record.versionId}`));
  void keepPictures(version.document).catch(() => undefined);
  const rows: LocalRow[] = [];
  for (const s of record.steps.filter((x) => !x.superseded)) {
    rows.push({
      id: s.id, stepId: s.stepId, after: rows[rows.length - 1]?.id ?? null, note: s.note, startedAt: s.startedAt, answeredAt: s.answeredAt,
      ...enteredOf(s),
    });
  }
  await commitLocal({
    id, versionId: record.versionId, procedureTitle: record.procedureTitle, vehicleLabel: record.vehicleLabel,
    meterEntries: record.meterEntries, startedAt: record.startedAt, rows, photos: [], status: 'active', updatedAt: new Date().toISOString(),
  }, []);
}
