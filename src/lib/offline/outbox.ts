import { api, ApiError } from '../api-client';
import { benchDb, type OutboxItem } from './db';

export interface SyncStatus {
  /** Messages still on the phone. */
  waiting: number;
  /** The first message the server refused, with its reason; later ones wait behind it. */
  refused: string | null;
  online: boolean;
  syncing: boolean;
}

let status: SyncStatus = { waiting: 0, refused: null, online: typeof navigator === 'undefined' ? true : navigator.onLine, syncing: false };
const listeners = new Set<() => void>();

function publish(next: Partial<SyncStatus>): void {
  status = { ...status, ...next };
  for (const l of listeners) l();
}

/** For useSyncExternalStore: the screen always shows whether everything is synced. */
export const syncStore = {
  subscribe(listener: () => void): () => void {
    listeners.add(listener);
    return () => listeners.delete(listener);
  },
  get: (): SyncStatus => status,
};

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

/** A failure that waiting will cure: no network, a timeout, the server busy or restarting. */
function transient(e: unknown): boolean {
  if (!(e instanceof ApiError)) return true;
  return e.isNetwork || e.status === 408 || e.status === 429 || e.status >= 500 || e.code === 'csrf';
}

let running: Promise<void> | null = null;

async function drain(): Promise<void> {
  const db = await benchDb();
  publish({ waiting: await db.count('outbox') }); // what was just queued shows at once
  for (;;) {
    const cursor = await db.transaction('outbox').store.openCursor();
    if (!cursor) break;
    const item = cursor.value;
    if (item.refused) {
      publish({ refused: item.refused });
      break;
    }
    try {
      await deliver(item);
      await db.delete('outbox', item.seq!);
      publish({ online: true, refused: null });
    } catch (e) {
      if (transient(e)) {
        publish({ online: !(e instanceof ApiError && e.isNetwork) });
        break;
      }
      // The server said no and will keep saying no: keep it, stop here, and say why.
      const reason = e instanceof ApiError ? e.message : 'The server refused a step.';
      await db.put('outbox', { ...item, refused: reason });
      publish({ refused: reason });
      break;
    } finally {
      publish({ waiting: await db.count('outbox') });
    }
  }
  publish({ waiting: await db.count('outbox') });
}

/** Sends what waits, oldest first, one at a time; stops at the first failure and tries later. */
export function flushOutbox(): Promise<void> {
  running ??= (async () => {
    publish({ syncing: true });
    try {
      await drain();
    } finally {
      publish({ syncing: false });
      running = null;
    }
  })();
  return running;
}

/** Forgets a refusal so the outbox tries again (after the technician reloaded or fixed it). */
export async function retryRefused(): Promise<void> {
  const db = await benchDb();
  const all = await db.getAll('outbox');
  for (const item of all) if (item.refused) await db.put('outbox', { ...item, refused: undefined });
  publish({ refused: null });
  await flushOutbox();
}

let started = false;

/** Starts syncing: now, whenever the network comes back, and every few seconds while anything waits. */
export function startOutbox(): void {
  if (started || typeof window === 'undefined') return;
  started = true;
  window.addEventListener('online', () => { publish({ online: true }); void flushOutbox(); });
  window.addEventListener('offline', () => publish({ online: false }));
  setInterval(() => { if (status.waiting > 0 && !status.refused) void flushOutbox(); }, 4000);
  void flushOutbox();
}
