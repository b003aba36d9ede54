import { openDB, type DBSchema, type IDBPDatabase } from 'idb';
import type { BenchVersion, DiagnosisStepBody, StartDiagnosisBody } from '@shared/schema/bench';
import type { MeterEntry } from '@shared/engine/meter';

/**
 * One answered step as the phone keeps it: the body of the step message it sends (the shared
 * Bench contract); `after` links it into the path (null = the start).
 */
export type LocalRow = DiagnosisStepBody & { note: string };

export interface LocalPhoto { id: string; stepId: string | null; name: string; thumbUrl: string }

/** A diagnosis as it lives on the phone: enough to walk on without the network. */
export interface LocalDiagnosis {
  id: string;
  versionId: string;
  procedureTitle: string;
  vehicleLabel: string;
  meterEntries: MeterEntry[];
  startedAt: string;
  rows: LocalRow[];
  photos: LocalPhoto[];
  status: 'active' | 'finished' | 'handed_off';
  updatedAt: string;
}

/** A published version kept on the phone; `branchCounts` are the shop's recorded branch frequencies when it was fetched. */
export type LocalVersion = Pick<BenchVersion, 'id' | 'slug' | 'title' | 'number' | 'document'> & { branchCounts?: BenchVersion['branchCounts'] };

/** What waits to be sent, in order. `seq` is the outbox order; `diagnosisId` groups it. */
export type OutboxMessage =
  | { kind: 'start'; body: StartDiagnosisBody }
  | { kind: 'step'; body: LocalRow }
  | { kind: 'photo'; id: string; stepId: string | null; name: string; photo: Blob; thumb: Blob | null };

export interface OutboxItem { seq?: number; diagnosisId: string; message: OutboxMessage; refused?: string; createdAt: string }

/**
 * A message the technician set aside after the server refused its diagnosis: kept on the phone
 * (never deleted) under its outbox `seq`, so the order of the record survives for a download.
 */
export interface AsideItem extends OutboxItem { seq: number; setAsideAt: string }

/** A reference picture of a kept version, in its phone rendition, so a step shows it without signal. */
export interface LocalPicture { id: string; blob: Blob; bytes: number; savedAt: string }

/** Lists the start page needs (procedures, machines, meters), as last fetched with signal. */
export interface KitEntry { key: string; data: unknown; savedAt: string }

interface BenchDb extends DBSchema {
  versions: { key: string; value: LocalVersion };
  kit: { key: string; value: KitEntry };
  diagnoses: { key: string; value: LocalDiagnosis };
  outbox: { key: number; value: OutboxItem; indexes: { byDiagnosis: string } };
  aside: { key: number; value: AsideItem; indexes: { byDiagnosis: string } };
  pictures: { key: string; value: LocalPicture };
}

let dbPromise: Promise<IDBPDatabase<BenchDb>> | null = null;
/** The database once open, so a write can begin in the task of the tap that asked for it. */
let opened: IDBPDatabase<BenchDb> | null = null;

/** The Bench database on this phone (IndexedDB through idb). */
export function benchDb(): Promise<IDBPDatabase<BenchDb>> {
  dbPromise ??= openDB<BenchDb>('sparkwright-bench', 4, {
    // Each store is made when missing, so any earlier version of this database upgrades.
    upgrade(db) {
      const has = (name: string) => db.objectStoreNames.contains(name as never);
      if (!has('versions')) db.createObjectStore('versions', { keyPath: 'id' });
      if (!has('diagnoses')) db.createObjectStore('diagnoses', { keyPath: 'id' });
      if (!has('outbox')) db.createObjectStore('outbox', { keyPath: 'seq', autoIncrement: true }).createIndex('byDiagnosis', 'diagnosisId');
      if (!has('kit')) db.createObjectStore('kit', { keyPath: 'key' });
      if (!has('aside')) db.createObjectStore('aside', { keyPath: 'seq' }).createIndex('byDiagnosis', 'diagnosisId');
      if (!has('pictures')) db.createObjectStore('pictures', { keyPath: 'id' });
    },
  }).then((db) => (opened = db));
  return dbPromise;
}

/**
 * The diagnosis this tab kept last and the versions it saved or read: a screen opened right after
 * a start or an answer draws from here instead of waiting for IndexedDB (see peekKept).
 */
let lastKept: LocalDiagnosis | null = null;
const versionsSeen = new Map<string, LocalVersion>();
const seen = (v: LocalVersion | undefined) => { if (v) versionsSeen.set(v.id, v); return v; };

/** The diagnosis as this tab last kept it on the phone, with its version, if both are at hand. */
export function peekKept(id: string): { diagnosis: LocalDiagnosis; version: LocalVersion } | null {
  const version = lastKept?.id === id ? versionsSeen.get(lastKept.versionId) : undefined;
  return lastKept && version ? { diagnosis: lastKept, version } : null;
}

export async function saveVersion(v: LocalVersion): Promise<void> {
  await (await benchDb()).put('versions', v);
  seen(v);
}
export async function getVersion(id: string): Promise<LocalVersion | undefined> {
  return seen(await (await benchDb()).get('versions', id));
}
/** The newest version of a procedure kept on this phone, by the procedure's slug. */
export async function findVersionBySlug(slug: string): Promise<LocalVersion | undefined> {
  const all = await (await benchDb()).getAll('versions');
  return all.filter((v) => v.slug === slug).sort((a, b) => b.number - a.number)[0];
}
export async function saveKit(key: string, data: unknown): Promise<void> {
  await (await benchDb()).put('kit', { key, data, savedAt: new Date().toISOString() });
}
export async function readKit(key: string): Promise<KitEntry | undefined> {
  return (await benchDb()).get('kit', key);
}
export async function getLocalDiagnosis(id: string): Promise<LocalDiagnosis | undefined> {
  return (await benchDb()).get('diagnoses', id);
}
export async function listLocalDiagnoses(): Promise<LocalDiagnosis[]> {
  return (await benchDb()).getAll('diagnoses');
}

/**
 * Changes a diagnosis and queues what the server must hear, in one IndexedDB transaction, so a
 * reload or a flat battery can never keep one without the other. A diagnosis set aside after a
 * refusal keeps its new messages aside too: the server would refuse them again, and the file the
 * lead downloads must hold every answer.
 */
/** Why the phone could not keep what was just answered, in words a technician can act on. */
export class PhoneStorageError extends Error {
  constructor(override readonly cause: unknown) {
    const quota = cause instanceof DOMException && cause.name === 'QuotaExceededError';
    super(quota
      ? 'This phone is out of storage, so the last answer was not saved. Free some space (photos, other apps), then answer again.'
      : 'This phone could not save the last answer (its browser storage refused it). Answer again; if it keeps failing, leave private browsing or restart the browser, and tell your lead.');
  }
}

type StorageListener = (problem: string | null) => void;
const storageListeners = new Set<StorageListener>();
/** Hears every failed (a message) and every good (null) write of a diagnosis to the phone. */
export function onStorageResult(listener: StorageListener): () => void {
  storageListeners.add(listener);
  return () => storageListeners.delete(listener);
}

/**
 * Keeps the diagnosis and its messages in one transaction. A failed write throws a
 * PhoneStorageError and tells onStorageResult's listeners, so the screen says so.
 *
 * Once the database is open, the transaction is opened, every request handed to IndexedDB and the
 * commit asked for before this returns, in the caller's task: a screen may then show the next step
 * at once, and the answer survives a reload right after the tap (tests/e2e/bench-durable.spec.ts).
 * Asking for the commit matters: Chromium drops a transaction still open when the page goes away.
 */
export function commitLocal(diagnosis: LocalDiagnosis, messages: OutboxMessage[]): Promise<void> {
  let written: Promise<void>;
  try {
    written = opened ? writeLocal(opened, diagnosis, messages) : benchDb().then((db) => writeLocal(db, diagnosis, messages));
  } catch (e) {
    written = Promise.reject(e); // db.transaction throws at once when the connection is closing
  }
  return written.then(
    () => { for (const l of storageListeners) l(null); },
    (e: unknown) => {
      const problem = new PhoneStorageError(e);
      for (const l of storageListeners) l(problem.message);
      throw problem;
    },
  );
}

/**
 * One transaction whose every request is issued at once, then committed without waiting for a
 * result: on a phone each wait is a trip through the event loop. A diagnosis set aside after a
 * refusal then moves the new messages aside in a second transaction (a reload between the two
 * leaves them in the outbox, where the server refuses them again and they can be set aside again:
 * nothing is lost).
 */
async function writeLocal(db: IDBPDatabase<BenchDb>, diagnosis: LocalDiagnosis, messages: OutboxMessage[]): Promise<void> {
  const tx = db.transaction(['diagnoses', 'outbox', 'aside'], 'readwrite');
  const now = new Date().toISOString();
  const stored = { ...diagnosis, updatedAt: now };
  const kept = tx.objectStore('diagnoses').put(stored);
  const items = messages.map((message) => ({ diagnosisId: diagnosis.id, message, createdAt: now }));
  const seqs = items.map((item) => tx.objectStore('outbox').add(item));
  const asideCount = messages.length ? tx.objectStore('aside').index('byDiagnosis').count(diagnosis.id) : Promise.resolve(0);
  tx.commit();
  const [, seqList, count] = await Promise.all([kept, Promise.all(seqs), asideCount, tx.done]);
  lastKept = stored;
  if (count > 0) await moveAside(db, items.map((item, i) => ({ ...item, seq: seqList[i]!, setAsideAt: now })));
}

/** Moves just-queued messages of a set-aside diagnosis from the outbox to `aside`, under their outbox seq. */
async function moveAside(db: IDBPDatabase<BenchDb>, items: AsideItem[]): Promise<void> {
  const tx = db.transaction(['outbox', 'aside'], 'readwrite');
  // The outbox's key generator gave the seq, so the two stores never clash.
  for (const item of items) void Promise.all([tx.objectStore('outbox').delete(item.seq), tx.objectStore('aside').put(item)]).catch(() => undefined);
  await tx.done;
}
