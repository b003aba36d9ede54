import { openDB, type DBSchema, type IDBPDatabase } from 'idb';

/** One answered step as the phone keeps it; `after` links it into the path (null = the start). */
export interface LocalRow {
  id: string;
  stepId: string;
  after: string | null;
  entered?: string;
  leadEntered?: string;
  answerId?: string;
  acknowledged?: boolean;
  note: string;
  outcome?: Record<string, unknown>;
  startedAt: string;
  answeredAt: string;
}

export interface LocalPhoto { id: string; stepId: string | null; name: string; thumbUrl: string }

/** A diagnosis as it lives on the phone: enough to walk on without the network. */
export interface LocalDiagnosis {
  id: string;
  versionId: string;
  procedureTitle: string;
  vehicleLabel: string;
  meterEntries: { quantity: string; percentOfReading: number; counts: number; resolution: number }[];
  startedAt: string;
  rows: LocalRow[];
  photos: LocalPhoto[];
  status: 'active' | 'finished' | 'handed_off';
  updatedAt: string;
}

export interface LocalVersion { id: string; slug: string; title: string; number: number; document: unknown }

/** What waits to be sent, in order. `seq` is the outbox order; `diagnosisId` groups it. */
export type OutboxMessage =
  | { kind: 'start'; body: Record<string, unknown> }
  | { kind: 'step'; body: LocalRow }
  | { kind: 'photo'; id: string; stepId: string | null; name: string; photo: Blob; thumb: Blob | null };

export interface OutboxItem { seq?: number; diagnosisId: string; message: OutboxMessage; refused?: string; createdAt: string }

interface BenchDb extends DBSchema {
  versions: { key: string; value: LocalVersion };
  diagnoses: { key: string; value: LocalDiagnosis };
  outbox: { key: number; value: OutboxItem; indexes: { byDiagnosis: string } };
}

let dbPromise: Promise<IDBPDatabase<BenchDb>> | null = null;

/** The Bench database on this phone (IndexedDB through idb). */
export function benchDb(): Promise<IDBPDatabase<BenchDb>> {
  dbPromise ??= openDB<BenchDb>('sparkwright-bench', 1, {
    upgrade(db) {
      db.createObjectStore('versions', { keyPath: 'id' });
      db.createObjectStore('diagnoses', { keyPath: 'id' });
      const outbox = db.createObjectStore('outbox', { keyPath: 'seq', autoIncrement: true });
      outbox.createIndex('byDiagnosis', 'diagnosisId');
    },
  });
  return dbPromise;
}

export async function saveVersion(v: LocalVersion): Promise<void> {
  await (await benchDb()).put('versions', v);
}
export async function getVersion(id: string): Promise<LocalVersion | undefined> {
  return (await benchDb()).get('versions', id);
}
export async function getLocalDiagnosis(id: string): Promise<LocalDiagnosis | undefined> {
  return (await benchDb()).get('diagnoses', id);
}
export async function listLocalDiagnoses(): Promise<LocalDiagnosis[]> {
  return (await benchDb()).getAll('diagnoses');
}

/**
 * Changes a diagnosis and queues what the server must hear, in one IndexedDB transaction, so a
 * reload or a flat battery can never keep one without the other.
 */
export async function commitLocal(diagnosis: LocalDiagnosis, messages: OutboxMessage[]): Promise<void> {
  const db = await benchDb();
  const tx = db.transaction(['diagnoses', 'outbox'], 'readwrite');
  await tx.objectStore('diagnoses').put({ ...diagnosis, updatedAt: new Date().toISOString() });
  const now = new Date().toISOString();
  for (const message of messages) await tx.objectStore('outbox').add({ diagnosisId: diagnosis.id, message, createdAt: now });
  await tx.done;
}
