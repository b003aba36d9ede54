import type { RequestHandler } from 'express';
import { QueryTypes, type Sequelize } from 'sequelize';

// Debrief's analytics and long lists may read a streaming replica (DATABASE_REPLICA_URL); the
// rest of the app reads and writes the primary. The replica is used only while it is at most
// REPLICA_MAX_LAG_SECONDS behind, measured the common way without extra privileges: every
// second each app server notes the primary's WAL position (pg_current_wal_lsn) and asks the
// replica how far it has replayed (pg_last_wal_replay_lsn); the lag is the age of the oldest
// noted position the replica has not replayed yet. A writer reads its own writes: a write
// request leaves a short-lived cookie, and while it lasts that browser's Debrief reads go to
// the primary. The cookie lasts the allowed lag plus one poll, so by the time it expires the
// replica was seen within the allowed lag of a moment after the write.

export const POLL_MS = 1000;
const WROTE_COOKIE = 'sw_wrote';
/** A tag at the head of every Debrief read, visible in pg_stat_activity on either server. */
export const READ_TAG = '/* sparkwright:debrief-read */ ';

export type ReplicaState = 'in use' | 'lagging' | 'down' | 'starting';
export interface ReplicaStatus { state: ReplicaState; lagSeconds: number | null; debriefReadsFrom: 'replica' | 'primary' }

export interface ReadReplica {
  sequelize: Sequelize;
  /** whether the replica may serve the Debrief reads of a request with these cookies */
  usable(cookies: string | undefined): boolean;
  /** a failed read on the replica: stop using it until the next good poll */
  failed(err: unknown): void;
  status(): ReplicaStatus;
  /** sets the read-your-writes cookie on write requests */
  markWrites: RequestHandler;
  close(): Promise<void>;
}

/** "16/B374D848" → a number of bytes (exact below 2^53, i.e. for some petabytes of WAL). */
function lsnBytes(lsn: string): number {
  const [hi, lo] = lsn.split('/');
  return parseInt(hi!, 16) * 2 ** 32 + parseInt(lo!, 16);
}

export function startReadReplica(opts: {
  primary: Sequelize; replica: Sequelize; maxLagSeconds: number; log: (msg: string, err?: unknown) => void;
}): ReadReplica {
  const { primary, replica, maxLagSeconds, log } = opts;
  const windowMs = maxLagSeconds * 1000 + POLL_MS;
  const noted: { at: number; lsn: number }[] = [];
  let state: ReplicaState = 'starting';
  let lagSeconds: number | null = null;
  let closed = false;
  const setState = (next: ReplicaState, why?: unknown) => {
    if (next !== state && next !== 'in use') log(`read replica ${next}: Debrief reads the primary${why instanceof Error ? ` (${why.message})` : ''}`);
    if (next !== state && next === 'in use' && state !== 'starting') log('read replica in use again for Debrief reads');
    state = next;
  };
  const one = async (db: Sequelize, sql: string) =>
    (await db.query<{ lsn: string | null }>(sql, { type: QueryTypes.SELECT }))[0]?.lsn ?? null;

  const poll = async () => {
    try {
      const at = Date.now();
      const head = await one(primary, 'SELECT pg_current_wal_lsn()::text AS lsn');
      if (head) noted.push({ at, lsn: lsnBytes(head) });
      while (noted.length > 2 && noted[1]!.at < at - windowMs * 4) noted.shift();
      const replayed = await one(replica, 'SELECT pg_last_wal_replay_lsn()::text AS lsn');
      if (replayed === null) throw new Error('that server is not a replica (pg_last_wal_replay_lsn is null)');
      const done = lsnBytes(replayed);
      const behind = noted.find((n) => n.lsn > done);
      lagSeconds = behind ? (Date.now() - behind.at) / 1000 : 0;
      setState(lagSeconds <= maxLagSeconds ? 'in use' : 'lagging');
    } catch (err) {
      lagSeconds = null;
      setState('down', err);
    }
  };
  let timer: NodeJS.Timeout | null = null;
  const loop = () => { void poll().finally(() => { if (!closed) timer = setTimeout(loop, POLL_MS).unref(); }); };
  loop();

  const wroteRecently = (cookies: string | undefined) => {
    const m = /(?:^|;\s*)sw_wrote=(\d+)/.exec(cookies ?? '');
    return m !== null && Date.now() - Number(m[1]) < windowMs;
  };
  return {
    sequelize: replica,
    usable: (cookies) => state === 'in use' && !wroteRecently(cookies),
    failed: (err) => setState('down', err),
    status: () => ({ state, lagSeconds, debriefReadsFrom: state === 'in use' ? 'replica' : 'primary' }),
    markWrites: (req, res, next) => {
      // signing in or out changes nothing Debrief reads
      if (req.method !== 'GET' && req.method !== 'HEAD' && !req.path.startsWith('/auth/')) {
        res.cookie(WROTE_COOKIE, String(Date.now()), { maxAge: windowMs, httpOnly: true, sameSite: 'lax', path: '/api' });
      }
      next();
    },
    async close() {
      closed = true;
      if (timer) clearTimeout(timer);
      await replica.close();
    },
  };
}
