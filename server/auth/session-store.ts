import session from 'express-session';
import { LRUCache } from 'lru-cache';
import { announce, onEviction } from '../lib/cache-bus';

/**
 * How long a process serves a session it has read or written without asking PostgreSQL again.
 * Signing out, signing in (which regenerates the session) and a password reset forget it at once,
 * here and, through the cache bus, on every other app server; should the bus be down, another
 * server trusts a signed-out session for at most this long.
 */
export const SESSION_CACHE_MS = 30_000;

interface Entry { json: string; userId: string | null; expires: number }

const cache = new LRUCache<string, Entry>({ max: 20_000, ttl: SESSION_CACHE_MS });
// Sessions destroyed a moment ago: a read that was already on its way must not bring one back.
const destroyed = new LRUCache<string, true>({ max: 20_000, ttl: SESSION_CACHE_MS });

type Callback<T = unknown> = (err?: unknown, value?: T) => void;

function userOf(sess: session.SessionData): string | null {
  return (sess as { passport?: { user?: { id?: string } } }).passport?.user?.id ?? null;
}

function expiryOf(sess: session.SessionData): number {
  const expires = sess.cookie?.expires;
  return expires ? new Date(expires).getTime() : Number.POSITIVE_INFINITY;
}

function remember(sid: string, sess: session.SessionData): void {
  if (destroyed.has(sid)) return;
  cache.set(sid, { json: JSON.stringify(sess), userId: userOf(sess), expires: expiryOf(sess) });
}

onEviction('session', (sid) => {
  cache.delete(sid);
  destroyed.set(sid, true);
}, () => cache.clear());
onEviction('user-sessions', (userId) => {
  for (const [sid, e] of cache.entries()) if (e.userId === userId) cache.delete(sid);
});

/** Forgets every cached session of a person, on every app server (their sessions were deleted). */
export function forgetSessionsOf(userId: string): void {
  announce('user-sessions', userId);
}

/**
 * A session store in front of another one (connect-pg-simple here): reads come from a small
 * per-process cache, so a signed-in request costs no session query; every write and destroy goes
 * to the database first. Each read hands out a fresh copy, so requests never share an object.
 */
export class CachedSessionStore extends session.Store {
  constructor(private readonly inner: session.Store) {
    super();
  }

  override get(sid: string, cb: Callback<session.SessionData | null>): void {
    const hit = cache.get(sid);
    if (hit && hit.expires > Date.now()) return cb(null, JSON.parse(hit.json) as session.SessionData);
    if (hit) cache.delete(sid);
    this.inner.get(sid, (err, sess) => {
      if (!err && sess) remember(sid, sess);
      cb(err, sess ?? null);
    });
  }

  override set(sid: string, sess: session.SessionData, cb?: Callback): void {
    cache.delete(sid);
    destroyed.delete(sid);
    this.inner.set(sid, sess, (err) => {
      if (!err) remember(sid, sess);
      cb?.(err);
    });
  }

  override destroy(sid: string, cb?: Callback): void {
    announce('session', sid);
    this.inner.destroy(sid, (err) => cb?.(err));
  }

  override touch(sid: string, sess: session.SessionData, cb?: () => void): void {
    if (this.inner.touch) this.inner.touch(sid, sess, () => cb?.());
    else cb?.();
  }
}
