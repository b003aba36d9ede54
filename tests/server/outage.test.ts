import { beforeAll, describe, expect, it } from 'vitest';
import { describeFigures, runOutage, type OutageFigures } from '../faults/outage-run';

// The short version of `npm run verify:outage`: one real app server process on a PostgreSQL of
// its own (.tmp/pg-outage), two technicians reading, two stepping and one phone with the real
// outbox, the database stopped for 3 s and started again. Each claim is its own test below.

let f: OutageFigures;
beforeAll(async () => {
  f = await runOutage({ name: 'outage', outageMs: 3000, readers: 2, writers: 2, warmMs: 1500, afterMs: 3000 });
  console.log(describeFigures(f));
}, 120_000);

describe('a database outage under load', () => {
  it('the app process keeps running through the outage', () => {
    expect(f.appExited).toBeNull();
  });

  it('while the database is down, requests answer 503 with the error envelope and Retry-After, within 2 s', () => {
    expect(f.unavailable).toBeGreaterThan(0);
    expect(f.improper).toEqual([]);
    expect(f.unexpected).toEqual([]);
    expect(f.slowestWhileDownMs).toBeLessThan(2000);
  });

  it('it serves again within 5 s of the database returning, and keeps serving', () => {
    expect(f.recoveryMs).toBeLessThanOrEqual(5000);
    expect(f.failuresAfterRecovery).toBe(0);
  });

  it('every write that was acknowledged with a 2xx is in the database afterwards', () => {
    expect(f.acknowledgedWrites).toBeGreaterThan(0);
    expect(f.acknowledgedLost).toBe(0);
  });

  it("the phone's outbox delivers every step answered during the outage exactly once, in order", () => {
    expect(f.phone.answeredWhileDown).toBeGreaterThan(3);
    expect(f.phone).toEqual({ queued: f.phone.queued, answeredWhileDown: f.phone.answeredWhileDown, stored: f.phone.queued, extra: 0, inOrder: true, leftOnPhone: 0 });
  });

  it('the sign-in limiter answers 503 while the database is down and counts failures again after it', () => {
    expect(f.signInWhileDown).toBe(503);
    expect(f.limiterAfter).toEqual([401, 401, 401, 429]); // LOGIN_RATE_LIMIT=3 for this server
  });

  it('the session store and the cache bus work again after the outage', () => {
    expect(f.freshSignInAfter).toBe(200);
    expect(f.cacheBusBackMs).toBeLessThan(10_000);
    expect(f.signOutHeardMs).toBeLessThan(1000);
  });
});
