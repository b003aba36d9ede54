import 'fake-indexeddb/auto';
import { IDBFactory } from 'fake-indexeddb';
import { openDB } from 'idb';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import type * as DbModule from '../../src/lib/offline/db';
import type * as OutboxModule from '../../src/lib/offline/outbox';
import type * as BadgeModule from '../../src/features/bench/components/sync-badge';

// The outbox runs for real against an in-memory IndexedDB (fake-indexeddb); only the network is
// replaced, by a small stand-in for the server behind `fetch` that answers as the real routes do
// (server/services/diagnosis*.ts): a start for a removed machine is a 404 "not_found", a step of
// a diagnosis the server never stored is a 404 too.

interface Sent { method: string; path: string; diagnosisId: string; id: string }

class FakeServer {
  sent: Sent[] = [];
  /** 'offline' rejects like a phone without signal; 'restarting' answers 503; 'signed-out' 401 (the session timed out). */
  mode: 'up' | 'offline' | 'restarting' | 'signed-out' = 'up';
  /** Starts the server refuses, by diagnosis id: the machine was removed meanwhile. */
  refuseStart = new Set<string>();
  started = new Set<string>();
  /** Steps answered 409 "busy" once, as the step route does when two answers race. */
  busyOnce = new Set<string>();

  fetch = async (url: string, init: RequestInit = {}): Promise<Response> => {
    if (this.mode === 'offline') throw new TypeError('Failed to fetch');
    if (this.mode === 'restarting') return json(503, { error: { code: 'unavailable', message: 'The server is restarting.' } });
    if (url === '/api/auth/csrf') return json(200, { token: 'csrf-token' });
    if (this.mode === 'signed-out') return json(401, { error: { code: 'session_expired', message: 'You were signed out after 120 minutes without use. Sign in again.', requestId: 'r1' } });
    const body = JSON.parse(String(init.body)) as { id: string };
    const step = /^\/api\/diagnoses\/([^/]+)\/steps$/.exec(url);
    const diagnosisId = step ? step[1]! : body.id;
    this.sent.push({ method: init.method ?? 'GET', path: url, diagnosisId, id: body.id });
    if (!step && this.refuseStart.has(diagnosisId)) return notFound('That machine');
    if (!step) { this.started.add(diagnosisId); return json(201, { created: true, id: diagnosisId }); }
    if (!this.started.has(diagnosisId)) return notFound('That diagnosis');
    if (this.busyOnce.delete(body.id)) return json(409, { error: { code: 'busy', message: 'Several answers reached this diagnosis at the same moment. Send the step again.' } });
    return json(201, { stored: true });
  };

  /** Ids of the steps that reached the server, in the order they arrived. */
  stepsOf(diagnosisId: string): string[] {
    return this.sent.filter((s) => s.path.endsWith('/steps') && s.diagnosisId === diagnosisId).map((s) => s.id);
  }
}

const json = (status: number, body: unknown) => new Response(JSON.stringify(body), { status, headers: { 'Content-Type': 'application/json' } });
const notFound = (what: string) => json(404, { error: { code: 'not_found', message: `${what} was not found in this shop. Check the link, or pick it again from the list.`, requestId: 'r1' } });

let server: FakeServer;
let db: typeof DbModule;
let outbox: typeof OutboxModule;
let words: typeof BadgeModule;

beforeEach(async () => {
  // A fresh phone for each test: an empty IndexedDB and freshly loaded modules (no cached handle).
  globalThis.indexedDB = new IDBFactory();
  vi.resetModules();
  server = new FakeServer();
  vi.stubGlobal('fetch', server.fetch);
  db = await import('../../src/lib/offline/db');
  outbox = await import('../../src/lib/offline/outbox');
  words = await import('../../src/features/bench/components/sync-badge');
});
afterEach(() => vi.unstubAllGlobals());

function localDiagnosis(id: string, vehicleLabel: string): DbModule.LocalDiagnosis {
  const now = new Date().toISOString();
  return { id, versionId: 'v1', procedureTitle: 'No spark', vehicleLabel, meterEntries: [], startedAt: now, rows: [], photos: [], status: 'active', updatedAt: now };
}
const start = (id: string): DbModule.OutboxMessage => ({
  kind: 'start',
  body: { id, procedureVersionId: 'v1', vehicleId: 'w-02', complaint: 'No spark', conditions: { engine: 'cold', ambientC: 18, startingMethod: 'kick' }, startedAt: '2026-12-02T08:00:00Z' },
});
const step = (id: string): DbModule.OutboxMessage => ({
  kind: 'step', body: { id, stepId: 'prepare', after: null, note: '', startedAt: '2026-12-02T08:00:00Z', answeredAt: '2026-12-02T08:01:00Z' },
});

/** Queues messages the way the Bench screens do: the diagnosis and its messages in one transaction. */
async function queue(diagnosisId: string, vehicleLabel: string, messages: DbModule.OutboxMessage[]): Promise<void> {
  await db.commitLocal(localDiagnosis(diagnosisId, vehicleLabel), messages);
}

async function queuedIds(): Promise<string[]> {
  const items = await (await db.benchDb()).getAll('outbox');
  return items.map((i) => (i.message.kind === 'photo' ? i.message.id : String(i.message.body.id)));
}

describe('the Bench outbox holds a refused diagnosis and goes on with the others', () => {
  it('a refused start does not block another diagnosis\'s steps', async () => {
    await queue('d-removed', 'W-02', [start('d-removed'), step('s-removed-1')]);
    await queue('d-fine', 'B-07', [start('d-fine'), step('s-fine-1'), step('s-fine-2')]);
    server.refuseStart.add('d-removed');

    await outbox.flushOutbox();

    expect(server.stepsOf('d-fine')).toEqual(['s-fine-1', 's-fine-2']);
    expect(server.stepsOf('d-removed')).toEqual([]); // held behind its start, never sent
    expect(await queuedIds()).toEqual(['d-removed', 's-removed-1']);
    const s = outbox.syncStore.get();
    expect(s.waiting).toBe(2);
    expect(s.refused).toEqual([expect.objectContaining({
      diagnosisId: 'd-removed', label: 'W-02 · No spark', held: 2, heldKinds: { start: 1, step: 1, photo: 0 },
      reason: 'That machine was not found in this shop. Check the link, or pick it again from the list.',
    })]);
  });

  it('order within a diagnosis holds after a refusal: later steps wait behind the refused one, then follow it in order', async () => {
    await queue('d1', 'W-02', [start('d1'), step('a'), step('b')]);
    await queue('d2', 'B-07', [start('d2'), step('x')]);
    await queue('d1', 'W-02', [step('c')]); // answered later, after d2's messages were queued
    server.refuseStart.add('d1');

    await outbox.flushOutbox();
    expect(server.sent.map((s) => s.id)).toEqual(['d1', 'd2', 'x']);
    expect(await queuedIds()).toEqual(['d1', 'a', 'b', 'c']);

    server.refuseStart.delete('d1'); // the lead put the machine back
    await outbox.retryDiagnosis('d1');
    expect(server.sent.map((s) => s.id)).toEqual(['d1', 'd2', 'x', 'd1', 'a', 'b', 'c']);
    expect(await queuedIds()).toEqual([]);
  });

  it('a transient failure stops the drain and keeps everything', async () => {
    await queue('d1', 'W-02', [start('d1'), step('a')]);
    await queue('d2', 'B-07', [start('d2')]);

    server.mode = 'restarting';
    await outbox.flushOutbox();
    expect(server.sent).toEqual([]);
    expect(await queuedIds()).toEqual(['d1', 'a', 'd2']);
    expect(outbox.syncStore.get()).toMatchObject({ waiting: 3, refused: [], online: true });

    server.mode = 'offline';
    await outbox.flushOutbox();
    expect(await queuedIds()).toEqual(['d1', 'a', 'd2']);
    expect(outbox.syncStore.get()).toMatchObject({ waiting: 3, refused: [], online: false });
    expect(words.syncLine(outbox.syncStore.get())).toBe('3 waiting to sync — no signal, kept on this phone');

    server.mode = 'up';
    await outbox.flushOutbox();
    expect(server.sent.map((s) => s.id)).toEqual(['d1', 'a', 'd2']);
    expect(outbox.syncStore.get().waiting).toBe(0);
  });

  it('when the session has timed out (401), the messages wait for the next sign-in instead of being refused', async () => {
    await queue('d1', 'W-02', [start('d1'), step('a')]);
    server.mode = 'signed-out';
    await outbox.flushOutbox();
    expect(await queuedIds()).toEqual(['d1', 'a']);
    expect(outbox.syncStore.get().refused).toEqual([]);

    server.mode = 'up'; // signed in again
    await outbox.flushOutbox();
    expect(server.stepsOf('d1')).toEqual(['a']);
    expect(await queuedIds()).toEqual([]);
  });

  it('a step the server calls busy waits and goes again at the next drain, instead of being refused', async () => {
    await queue('d1', 'W-02', [start('d1'), step('a'), step('b')]);
    server.busyOnce.add('a');
    await outbox.flushOutbox();
    expect(await queuedIds()).toEqual(['a', 'b']);
    expect(outbox.syncStore.get().refused).toEqual([]);

    await outbox.flushOutbox();
    expect(server.stepsOf('d1')).toEqual(['a', 'a', 'b']);
    expect(await queuedIds()).toEqual([]);
  });

  it('try again re-sends a refused diagnosis, and keeps it refused while the server still says no', async () => {
    await queue('d1', 'W-02', [start('d1'), step('a')]);
    server.refuseStart.add('d1');
    await outbox.flushOutbox();
    expect(server.sent.map((s) => s.id)).toEqual(['d1']);

    await outbox.retryDiagnosis('d1');
    expect(server.sent.map((s) => s.id)).toEqual(['d1', 'd1']); // sent again, refused again, step still held
    expect(outbox.syncStore.get().refused.map((r) => r.diagnosisId)).toEqual(['d1']);

    server.refuseStart.delete('d1');
    await outbox.retryDiagnosis('d1');
    expect(server.sent.map((s) => s.id)).toEqual(['d1', 'd1', 'd1', 'a']);
    expect(outbox.syncStore.get()).toMatchObject({ waiting: 0, refused: [] });
    expect(words.syncLine(outbox.syncStore.get())).toBe('All synced');
  });

  it('set aside moves its messages to aside and the badge status says all synced with one set aside', async () => {
    const photo: DbModule.OutboxMessage = { kind: 'photo', id: 'p1', stepId: 'prepare', name: 'plug.jpg', photo: new Blob(['jpeg bytes']), thumb: null };
    await queue('d1', 'W-02', [start('d1'), step('a'), photo]);
    await queue('d2', 'B-07', [start('d2')]);
    server.refuseStart.add('d1');
    await outbox.flushOutbox();
    expect(words.syncLine(outbox.syncStore.get())).toBe('3 waiting to sync');

    await outbox.setAside('d1');

    expect(await queuedIds()).toEqual([]);
    const aside = await (await db.benchDb()).getAll('aside');
    expect(aside.map((i) => i.message.kind)).toEqual(['start', 'step', 'photo']);
    expect(aside[0]!.refused).toMatch(/^That machine was not found/);
    const s = outbox.syncStore.get();
    expect(s).toMatchObject({ waiting: 0, refused: [], aside: [expect.objectContaining({ diagnosisId: 'd1', label: 'W-02 · No spark', messages: 3 })] });
    expect(words.syncLine(s)).toBe('All synced · 1 diagnosis set aside on this phone');

    const record = await outbox.setAsideRecord('d1');
    expect(record.diagnosis?.vehicleLabel).toBe('W-02');
    expect(record.messages.map((m) => m.kind)).toEqual(['start', 'step', 'photo']);
    expect(record.messages[2]!.body).toEqual({ id: 'p1', stepId: 'prepare', name: 'plug.jpg' }); // the name, not the bytes
    expect(JSON.parse(JSON.stringify(record))).toEqual(record); // plain JSON, fit for a file
  });

  it('a step answered after its diagnosis was set aside stays aside, in order, and is never sent', async () => {
    await queue('d1', 'W-02', [start('d1'), step('a')]);
    server.refuseStart.add('d1');
    await outbox.flushOutbox();
    await outbox.setAside('d1');

    await queue('d1', 'W-02', [step('b')]);
    await queue('d2', 'B-07', [start('d2')]);
    await outbox.flushOutbox();

    expect(server.sent.map((s) => s.id)).toEqual(['d1', 'd2']); // d1's start once, refused; nothing after it
    expect(await queuedIds()).toEqual([]);
    expect((await outbox.setAsideRecord('d1')).messages.map((m) => (m.body as { id: string }).id)).toEqual(['d1', 'a', 'b']);
    expect(outbox.syncStore.get()).toMatchObject({ waiting: 0, refused: [], aside: [expect.objectContaining({ diagnosisId: 'd1', messages: 3 })] });
  });

  it('removing a set-aside diagnosis takes it and its messages off the phone, and nothing else', async () => {
    await queue('d1', 'W-02', [start('d1'), step('a')]);
    await queue('d2', 'B-07', [start('d2')]);
    server.refuseStart.add('d1');
    server.mode = 'up';
    await outbox.flushOutbox();
    await outbox.setAside('d1');
    server.mode = 'offline';
    await queue('d3', 'H-11', [start('d3')]);

    await outbox.removeSetAside('d1');
    await outbox.removeSetAside('d3'); // not set aside: refused quietly, kept

    const phone = await db.benchDb();
    expect(await phone.getAll('aside')).toEqual([]);
    expect((await db.listLocalDiagnoses()).map((d) => d.id).sort()).toEqual(['d2', 'd3']);
    expect(await queuedIds()).toEqual(['d3']);
    expect(outbox.syncStore.get().aside).toEqual([]);
  });

  it('set aside leaves a diagnosis that was not refused in the outbox', async () => {
    server.mode = 'offline';
    await queue('d1', 'W-02', [start('d1')]);
    await outbox.setAside('d1');
    expect(await queuedIds()).toEqual(['d1']);
    expect(outbox.syncStore.get().aside).toEqual([]);
  });
});

describe('the Bench outbox backs off while the server cannot be reached', () => {
  it('the wait doubles from 4 s with each failed pass, half of it random, and stops growing at 5 min', () => {
    expect([1, 2, 3, 4].map((n) => outbox.retryDelay(n, () => 1))).toEqual([4000, 8000, 16000, 32000]);
    expect([1, 2, 3, 4].map((n) => outbox.retryDelay(n, () => 0))).toEqual([2000, 4000, 8000, 16000]);
    expect(outbox.retryDelay(30, () => 1)).toBe(300_000);
    expect(outbox.retryDelay(30, () => 0)).toBe(150_000);
  });

  it('each failed pass waits longer than the last, and one pass that goes through forgets the failures', async () => {
    await queue('d1', 'W-02', [start('d1')]);
    server.mode = 'offline';
    const ceilings: number[] = [];
    for (let i = 0; i < 9; i++) {
      await outbox.flushOutbox();
      const s = outbox.syncStore.get();
      expect(s.failedPasses).toBe(i + 1);
      ceilings.push(Math.min(300_000, 4000 * 2 ** i));
      expect(s.retryInMs).toBeGreaterThanOrEqual(ceilings[i]! / 2);
      expect(s.retryInMs).toBeLessThanOrEqual(ceilings[i]!);
    }
    expect(ceilings.at(-1)).toBe(300_000); // the cap is reached, not passed
    server.mode = 'up';
    await outbox.flushOutbox();
    expect(outbox.syncStore.get()).toMatchObject({ waiting: 0, failedPasses: 0, retryInMs: null });
  });
});

describe('a failed write to the phone\'s storage', () => {
  it('is refused with words a technician can act on, shows in the sync status, and clears with the next good write', async () => {
    // a value IndexedDB cannot store (structured clone refuses a function): a real failed write
    const broken = { ...localDiagnosis('d1', 'W-02'), rows: [() => undefined] } as unknown as DbModule.LocalDiagnosis;
    const err = await db.commitLocal(broken, [start('d1')]).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(db.PhoneStorageError);
    expect((err as Error).message).toMatch(/could not save the last answer.*Answer again/);
    expect(outbox.syncStore.get().storageProblem).toBe((err as Error).message);
    expect(await queuedIds()).toEqual([]); // nothing half-stored: the diagnosis and its message go together or not at all
    await queue('d1', 'W-02', [start('d1')]);
    expect(outbox.syncStore.get().storageProblem).toBeNull();
  });
});

describe('the Bench database on the phone upgrades in place', () => {
  it('v2 database upgrades to the current version (v4: pictures) keeping queued messages', async () => {
    // Version 2 exactly as phones have it: four stores, the outbox indexed by diagnosis.
    const v2 = await openDB('sparkwright-bench', 2, {
      upgrade(d) {
        d.createObjectStore('versions', { keyPath: 'id' });
        d.createObjectStore('diagnoses', { keyPath: 'id' });
        d.createObjectStore('outbox', { keyPath: 'seq', autoIncrement: true }).createIndex('byDiagnosis', 'diagnosisId');
        d.createObjectStore('kit', { keyPath: 'key' });
      },
    });
    await v2.put('diagnoses', localDiagnosis('d1', 'W-02'));
    for (const message of [start('d1'), step('a')]) await v2.add('outbox', { diagnosisId: 'd1', message, createdAt: '2026-12-02T08:00:00Z' });
    v2.close();

    const v4 = await db.benchDb();
    expect(v4.version).toBe(4);
    expect([...v4.objectStoreNames].sort()).toEqual(['aside', 'diagnoses', 'kit', 'outbox', 'pictures', 'versions']);
    expect(await queuedIds()).toEqual(['d1', 'a']);

    await outbox.flushOutbox();
    expect(server.sent.map((s) => s.id)).toEqual(['d1', 'a']);
  });
});
