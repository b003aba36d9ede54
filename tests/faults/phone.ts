import 'fake-indexeddb/auto';
import { randomUUID } from 'node:crypto';
import type { LocalDiagnosis, OutboxMessage } from '../../src/lib/offline/db';
import { loopStep, startBody, type LoopWorld, type Session } from './bench-session';
import { sleep } from './processes';

// The phone's real Bench outbox (src/lib/offline/outbox.ts over fake-indexeddb) talking to a real
// app server: `fetch` is only pointed at that server's address with the phone's session cookie,
// as the browser would do for the page's own origin.

export interface Phone {
  diagnosisId: string;
  /** ids of the steps answered on the phone, in order */
  queued: string[];
  /** Answers one more step: kept on the phone first, then the outbox tries to send what waits. */
  answer(): Promise<void>;
  /** Keeps sending until nothing waits or the time is up; resolves with what is still waiting. */
  drain(timeoutMs: number): Promise<number>;
  restore(): void;
}

export async function phoneAgainst(base: string, session: Session, world: LoopWorld): Promise<Phone> {
  const realFetch = globalThis.fetch;
  globalThis.fetch = ((input: string | URL | Request, init: RequestInit = {}) => {
    const url = String(input);
    if (!url.startsWith('/')) return realFetch(input, init);
    const headers = { ...(init.headers as Record<string, string> | undefined), cookie: session.cookie };
    return realFetch(`${base}${url}`, { ...init, headers, signal: AbortSignal.timeout(10_000) });
  }) as typeof fetch;
  const db = await import('../../src/lib/offline/db');
  const outbox = await import('../../src/lib/offline/outbox');

  const start = startBody(world);
  const local: LocalDiagnosis = {
    id: start.id, versionId: world.versionId, procedureTitle: 'Exciter loop', vehicleLabel: 'W-01', meterEntries: [],
    startedAt: start.startedAt, rows: [], photos: [], status: 'active', updatedAt: start.startedAt,
  };
  const queued: string[] = [];
  const flush = () => outbox.flushOutbox().catch(() => undefined);
  return {
    diagnosisId: start.id,
    queued,
    async answer() {
      const step = loopStep(queued.at(-1) ?? null, '0,15k', randomUUID());
      const messages: OutboxMessage[] = [
        ...(queued.length === 0 ? [{ kind: 'start', body: start } as const] : []),
        { kind: 'step', body: step },
      ];
      await db.commitLocal(local, messages);
      queued.push(step.id);
      void flush();
    },
    async drain(timeoutMs) {
      const until = performance.now() + timeoutMs;
      for (;;) {
        await flush();
        const waiting = outbox.syncStore.get().waiting;
        if (waiting === 0 || performance.now() > until) return waiting;
        await sleep(250);
      }
    },
    restore() {
      globalThis.fetch = realFetch;
    },
  };
}
