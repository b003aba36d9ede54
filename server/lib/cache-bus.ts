import pg from 'pg';
import { pgClientTimeouts } from '../db';

// Per-process caches (sessions, members' roles) forget an entry at once in the process that
// changed it; this bus tells every other app server on the same database too, through
// PostgreSQL's LISTEN/NOTIFY. Without it (the bus down, or not started) the caches' short
// lifetimes still bound how long another server trusts a stale entry.

const CHANNEL = 'sparkwright_cache';
/** Between attempts to listen again after the connection dropped (each lost one resets the caches). */
const RECONNECT_MS = 2000;

export type EvictionKind = 'session' | 'user-sessions' | 'membership';

const handlers = new Map<EvictionKind, (key: string) => void>();
/** What each cache does when the bus is lost: forget everything, as nobody can tell it what changed. */
const resets: (() => void)[] = [];

/** A cache says how it forgets one entry (and all of them). */
export function onEviction(kind: EvictionKind, forget: (key: string) => void, forgetAll?: () => void): void {
  handlers.set(kind, forget);
  if (forgetAll) resets.push(forgetAll);
}

interface Listener { client: pg.Client | null; closed: boolean }
const listeners = new Set<Listener>();

/** Forgets an entry here at once, then tells the other app servers. Never throws. */
export function announce(kind: EvictionKind, key: string): void {
  handlers.get(kind)?.(key);
  const client = [...listeners].find((l) => !l.closed && l.client)?.client;
  client?.query('SELECT pg_notify($1, $2)', [CHANNEL, `${kind}:${key}`]).catch(() => undefined);
}

function deliver(payload: string | undefined): void {
  if (!payload) return;
  const at = payload.indexOf(':');
  handlers.get(payload.slice(0, at) as EvictionKind)?.(payload.slice(at + 1));
}

/**
 * Listens for other servers' evictions on a connection of its own, reconnecting every few seconds
 * when it drops (and forgetting every cached entry then, since some news may have been missed).
 * Returns stop().
 */
export async function startCacheBus(databaseUrl: string, log: (msg: string, err?: unknown) => void): Promise<() => Promise<void>> {
  const listener: Listener = { client: null, closed: false };
  let retry: NodeJS.Timeout | null = null;
  let connectedBefore = false;
  const connect = async (): Promise<void> => {
    const client = new pg.Client({ connectionString: databaseUrl, application_name: 'sparkwright-cache-bus', ...pgClientTimeouts });
    client.on('notification', (m) => deliver(m.payload));
    const lost = (err?: unknown) => {
      if (listener.closed || listener.client !== client) return;
      log('the cache bus lost its database connection; cached sessions and roles are forgotten until it is back', err);
      listener.client = null;
      for (const reset of resets) reset();
      void client.end().catch(() => undefined);
      later();
    };
    client.on('error', lost);
    client.on('end', () => lost());
    await client.connect();
    await client.query(`LISTEN ${CHANNEL}`);
    // Back after a loss: what was cached while nobody listened may have missed an eviction.
    if (connectedBefore) for (const reset of resets) reset();
    listener.client = client;
    connectedBefore = true;
  };
  const later = () => {
    retry = setTimeout(() => void connect().catch((err: unknown) => { log('the cache bus could not reconnect yet', err); later(); }), RECONNECT_MS);
  };
  await connect();
  listeners.add(listener);
  return async () => {
    listener.closed = true;
    listeners.delete(listener);
    if (retry) clearTimeout(retry);
    await listener.client?.end().catch(() => undefined);
  };
}
