import { api, ApiError } from '../api-client';
import { benchDb, onStorageResult, type AsideItem, type LocalDiagnosis, type OutboxItem, type OutboxMessage } from './db';

type Db = Awaited<ReturnType<typeof benchDb>>;

/** A diagnosis whose messages the server refused for good: they stay on the phone, held. */
export interface RefusedDiagnosis {
  diagnosisId: string;
  /** The server's own words for the first refused message. */
  reason: string;
  /** Messages of this diagnosis on the phone: the refused one and those queued after it. */
  held: number;
  /** The same, by kind, so the screen can say "the start and 2 steps". */
  heldKinds: Record<OutboxMessage['kind'], number>;
  /** "Vehicle · procedure" from the diagnosis kept on the phone; null when the phone no longer has it. */
  label: string | null;
}

/** A diagnosis whose refused messages were set aside on this phone (nothing deleted). */
export interface AsideDiagnosis { diagnosisId: string; label: string | null; messages: number; setAsideAt: string }

export interface SyncStatus {
  /** Messages still on the phone for the server, held ones included. */
  waiting: number;
  /** Diagnoses the server refused; other diagnoses' messages go on past them. */
  refused: RefusedDiagnosis[];
  aside: AsideDiagnosis[];
  online: boolean;
  syncing: boolean;
  /** Passes in a row that ended on a transient failure (no signal, server busy); 0 after a clean pass. */
  failedPasses: number;
  /** When the next pass is due after a transient failure (ms from that failure), or null. */
  retryInMs: number | null;
  /** The last write to the phone's storage failed: what to tell the technician (null once one succeeds). */
  storageProblem: string | null;
}

let status: SyncStatus = {
  waiting: 0, refused: [], aside: [], online: typeof navigator === 'undefined' ? true : navigator.onLine, syncing: false,
  failedPasses: 0, retryInMs: null, storageProblem: null,
};

/** The first wait after a failed pass, and the longest: a phone in a dead spot tries every 5 min, not every 4 s. */
export const RETRY_BASE_MS = 4000;
export const RETRY_CAP_MS = 5 * 60_000;

/**
 * The wait before the next pass after `failedPasses` failed ones: exponential, capped, with
 * "equal jitter" (half fixed, half random) so that a shop's phones coming back into signal at
 * once do not all knock on the server in the same second.
 * Example: retryDelay(1, () => 0) is 2000; retryDelay(3, () => 1) is 16000; retryDelay(20, () => 1) is 300000.
 */
export function retryDelay(failedPasses: number, random: () => number = Math.random): number {
  const ceiling = Math.min(RETRY_CAP_MS, RETRY_BASE_MS * 2 ** Math.max(0, failedPasses - 1));
  return Math.round(ceiling / 2 + random() * (ceiling / 2));
}
const listeners = new Set<() => void>();

function publish(next: Partial<SyncStatus>): void {
  status = { ...status, ...next };
  for (const l of listeners) l();
}

onStorageResult((storageProblem) => { if (storageProblem !== status.storageProblem) publish({ storageProblem }); });

/** Messages that can still go now: those waiting less those held behind a refusal. */
export function sendable(s: SyncStatus): number {
  return s.waiting - s.refused.reduce((n, r) => n + r.held, 0);
}

/** For useSyncExternalStore: the screen always shows whether everything is synced. */
export const syncStore = {
  subscribe(listener: () => void): () => void {
    listeners.add(listener);
    return () => listeners.delete(listener);
  },
  get: (): SyncStatus => status,
};

function labelOf(d: LocalDiagnosis | undefined): string | null {
  return d ? [d.vehicleLabel, d.procedureTitle].filter(Boolean).join(' · ') || null : null;
}

/** Groups messages by diagnosis, keeping the outbox order of each diagnosis's first message. */
function byDiagnosis<T extends OutboxItem>(items: T[]): Map<string, T[]> {
  const groups = new Map<string, T[]>();
  for (const item of items) {
    const group = groups.get(item.diagnosisId);
    if (group) group.push(item);
    else groups.set(item.diagnosisId, [item]);
  }
  return groups;
}

function kindsOf(items: OutboxItem[]): RefusedDiagnosis['heldKinds'] {
  const kinds = { start: 0, step: 0, photo: 0 };
  for (const item of items) kinds[item.message.kind]++;
  return kinds;
}

/** Re-reads what waits, what is held and what is set aside, and tells the screen. */
async function refresh(db: Db): Promise<void> {
  const [queued, aside] = await Promise.all([db.getAll('outbox'), db.getAll('aside')]);
  const label = async (id: string) => labelOf(await db.get('diagnoses', id));
  const refused = await Promise.all(
    [...byDiagnosis(queued)].filter(([, items]) => items.some((i) => i.refused)).map(async ([diagnosisId, items]) => ({
      diagnosisId, reason: items.find((i) => i.refused)!.refused!, held: items.length, heldKinds: kindsOf(items), label: await label(diagnosisId),
    })),
  );
  const setAside = await Promise.all([...byDiagnosis(aside)].map(async ([diagnosisId, items]) => ({
    diagnosisId, label: await label(diagnosisId), messages: items.length, setAsideAt: items.at(-1)!.setAsideAt,
  })));
  publish({ waiting: queued.length, refused, aside: setAside });
}

async function deliver(item: OutboxItem): Promise<void> {
  const m = item.message;
  if (m.kind === 'start') await api.post('/api/diagnoses', m.body);
  else if (m.kind === 'step') await api.post(`/api/diagnoses/${item.diagnosisId}/steps`, m.body);
  else {
    const form = new FormData();
    form.set('id', m.id);
    form.set('diagnosisId', item.diagnosisId);
    if (m.stepId) form.set('stepId', m.stepId);
    form.set('photo', m.photo, m.name);
    if (m.thumb) form.set('thumb', m.thumb, 'thumb.jpg');
    await api.upload('/api/attachments', form);
  }
}

/**
 * A failure that waiting will cure: no network, a timeout, the server busy or restarting, or the
 * session over (401: idle or shift timeout, or signed out; the messages wait for the next
 * sign-in). The step route answers 409 "busy" when two answers race; sending again is its own advice.
 */
function transient(e: unknown): boolean {
  if (!(e instanceof ApiError)) return true;
  return e.isNetwork || e.status === 401 || e.status === 408 || e.status === 429 || e.status >= 500 || e.code === 'csrf' || e.code === 'busy';
}

/**
 * The oldest message after `after` that may go now. A refused message holds every later message
 * of its diagnosis (a step must never overtake its start or an earlier step), so its diagnosis
 * joins `held`; the outbox is walked in order, so a refusal is always met before what it holds.
 */
async function nextToSend(db: Db, after: number, held: Set<string>): Promise<OutboxItem | null> {
  let cursor = await db.transaction('outbox').store.openCursor(IDBKeyRange.lowerBound(after, true));
  while (cursor) {
    const item = cursor.value;
    if (item.refused) held.add(item.diagnosisId);
    else if (!held.has(item.diagnosisId)) return item;
    cursor = await cursor.continue();
  }
  return null;
}

/** Sends one message: 'sent', 'refused' (kept, marked with the server's reason) or 'transient'. */
async function attempt(db: Db, item: OutboxItem): Promise<'sent' | 'refused' | 'transient'> {
  try {
    await deliver(item);
    await db.delete('outbox', item.seq!);
    publish({ online: true });
    return 'sent';
  } catch (e) {
    if (transient(e)) {
      publish({ online: !(e instanceof ApiError && e.isNetwork) });
      return 'transient';
    }
    const reason = e instanceof ApiError ? e.message : 'The server refused this diagnosis.';
    await db.put('outbox', { ...item, refused: reason });
    return 'refused';
  }
}

/**
 * One pass over the outbox in order; a transient failure ends it (answering false), a refusal
 * only holds its diagnosis.
 */
async function drain(db: Db): Promise<boolean> {
  const held = new Set<string>();
  let after = 0;
  for (;;) {
    const item = await nextToSend(db, after, held);
    if (!item) return true;
    after = item.seq!;
    const outcome = await attempt(db, item);
    if (outcome === 'transient') return false;
    if (outcome === 'sent') {
      // A sent message changes only the count: no refusal or set-aside list to read again.
      publish({ waiting: await db.count('outbox') });
      continue;
    }
    held.add(item.diagnosisId);
    await refresh(db);
  }
}

let running: Promise<void> | null = null;
let again = false;
let retryTimer: ReturnType<typeof setTimeout> | null = null;
let started = false;

/** After a pass: back off when it failed, forget the failures when it went through. */
function scheduleRetry(clean: boolean): void {
  if (retryTimer) clearTimeout(retryTimer);
  retryTimer = null;
  if (clean) {
    publish({ failedPasses: 0, retryInMs: null });
    return;
  }
  const failedPasses = status.failedPasses + 1;
  const retryInMs = retryDelay(failedPasses);
  publish({ failedPasses, retryInMs });
  if (started) retryTimer = setTimeout(() => { retryTimer = null; if (sendable(status) > 0) void flushOutbox(); }, retryInMs);
}

/**
 * Sends what waits, oldest first, one at a time. A call while a pass runs asks for one more pass
 * (a new step, or a refusal cleared behind the running pass), and resolves after it.
 */
export function flushOutbox(): Promise<void> {
  if (running) {
    again = true;
    return running;
  }
  running = (async () => {
    publish({ syncing: true });
    try {
      const db = await benchDb();
      let clean: boolean;
      do {
        again = false;
        await refresh(db); // what was just queued shows at once
        clean = await drain(db);
      } while (again && clean);
      await refresh(db);
      scheduleRetry(clean);
    } finally {
      publish({ syncing: false });
      running = null;
    }
  })();
  return running;
}

/** Forgets the refusal of one diagnosis, so its messages are sent again in their order. */
export async function retryDiagnosis(diagnosisId: string): Promise<void> {
  const db = await benchDb();
  const tx = db.transaction('outbox', 'readwrite');
  for (const item of await tx.store.index('byDiagnosis').getAll(diagnosisId)) {
    if (item.refused) await tx.store.put({ ...item, refused: undefined });
  }
  await tx.done;
  await flushOutbox();
}

/**
 * Moves a refused diagnosis's messages from the outbox to the `aside` store in one transaction,
 * so they stop counting as waiting but stay on the phone for a download. A diagnosis that was
 * not refused is left alone: setting aside is the answer to a refusal, not a way to skip sending.
 */
export async function setAside(diagnosisId: string): Promise<void> {
  const db = await benchDb();
  const tx = db.transaction(['outbox', 'aside'], 'readwrite');
  const items = await tx.objectStore('outbox').index('byDiagnosis').getAll(diagnosisId);
  if (items.some((i) => i.refused)) {
    const setAsideAt = new Date().toISOString();
    for (const item of items) {
      await tx.objectStore('aside').put({ ...item, seq: item.seq!, setAsideAt });
      await tx.objectStore('outbox').delete(item.seq!);
    }
  }
  await tx.done;
  await refresh(db);
}

/**
 * Removes a set-aside diagnosis from this phone once the lead has its file: its set-aside
 * messages and the diagnosis itself, in one transaction. Only set-aside diagnoses can go.
 */
export async function removeSetAside(diagnosisId: string): Promise<void> {
  const db = await benchDb();
  const tx = db.transaction(['aside', 'diagnoses'], 'readwrite');
  const keys = await tx.objectStore('aside').index('byDiagnosis').getAllKeys(diagnosisId);
  if (keys.length > 0) {
    for (const key of keys) await tx.objectStore('aside').delete(key);
    await tx.objectStore('diagnoses').delete(diagnosisId);
  }
  await tx.done;
  await refresh(db);
}

/** What a set-aside diagnosis's file holds: the diagnosis as on the phone and its messages, photos by name. */
export interface SetAsideRecord {
  format: 'sparkwright-set-aside';
  formatVersion: 1;
  note: string;
  savedAt: string;
  diagnosis: (Omit<LocalDiagnosis, 'photos'> & { photos: { id: string; stepId: string | null; name: string }[] }) | null;
  messages: { seq: number; createdAt: string; setAsideAt: string; refused: string | null; kind: string; body: unknown }[];
}

function messageForFile(item: AsideItem): SetAsideRecord['messages'][number] {
  const m = item.message;
  // Photo bytes stay on the phone: a lead re-enters the record by hand and asks for the photos.
  const body = m.kind === 'photo' ? { id: m.id, stepId: m.stepId, name: m.name } : m.body;
  return { seq: item.seq, createdAt: item.createdAt, setAsideAt: item.setAsideAt, refused: item.refused ?? null, kind: m.kind, body };
}

/** The set-aside record of one diagnosis, for a lead to re-enter by hand. */
export async function setAsideRecord(diagnosisId: string): Promise<SetAsideRecord> {
  const db = await benchDb();
  const [d, items] = await Promise.all([db.get('diagnoses', diagnosisId), db.getAllFromIndex('aside', 'byDiagnosis', diagnosisId)]);
  return {
    format: 'sparkwright-set-aside',
    formatVersion: 1,
    note: 'The server refused this diagnosis, so it was set aside on the phone. Photos are listed by name only; their files stay on the phone.',
    savedAt: new Date().toISOString(),
    diagnosis: d ? { ...d, photos: d.photos.map(({ id, stepId, name }) => ({ id, stepId, name })) } : null,
    messages: items.map(messageForFile),
  };
}

/**
 * Starts syncing: now, whenever the network comes back (with the back-off forgotten), and after a
 * failed pass once its back-off has passed (retryDelay).
 */
export function startOutbox(): void {
  if (started || typeof window === 'undefined') return;
  started = true;
  window.addEventListener('online', () => { publish({ online: true, failedPasses: 0 }); void flushOutbox(); });
  window.addEventListener('offline', () => publish({ online: false }));
  void flushOutbox();
}
