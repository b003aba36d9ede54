import type { Request, RequestHandler } from 'express';
import { AppError } from '../lib/errors';

declare module 'express-session' {
  interface SessionData {
    /** when the person signed in (ms); the absolute lifetime counts from here */
    signedInAt?: number;
    /** when the session was last used, recorded at most every USE_RECORD_MS */
    lastSeenAt?: number;
  }
}

/**
 * Use is written back to the session at most this often, so that a signed-in request costs no
 * session write; the idle timeout is therefore exact to these 5 minutes.
 */
export const USE_RECORD_MS = 5 * 60_000;

export interface SessionLimits { idleMs: number; maxMs: number }

/** Starts the clocks of a session that has just been signed in (the session was regenerated). */
export function startSessionClock(req: Request, now = Date.now()): void {
  req.session.signedInAt = now;
  req.session.lastSeenAt = now;
}

/**
 * Ends a signed-in session that has not been used for `idleMs`, or that began more than `maxMs`
 * ago however busy it was; the request then answers 401 and the person signs in again.
 */
export function sessionLifetime(limits: SessionLimits): RequestHandler {
  return (req, res, next) => {
    if (!req.user) return next();
    const now = Date.now();
    const s = req.session;
    // a session from before these clocks existed starts them now
    if (s.signedInAt === undefined) startSessionClock(req, now);
    const idle = now - (s.lastSeenAt ?? now) > limits.idleMs;
    if (idle || now - s.signedInAt! > limits.maxMs) {
      const why = idle
        ? `You were signed out after ${Math.round(limits.idleMs / 60_000)} minutes without use.`
        : `You were signed out ${Math.round(limits.maxMs / 3_600_000)} hours after signing in.`;
      s.destroy(() => {
        res.clearCookie('sw.sid');
        next(new AppError(401, 'session_expired', `${why} Sign in again; anything the Bench kept on this phone is still there.`));
      });
      return;
    }
    if (now - (s.lastSeenAt ?? 0) >= USE_RECORD_MS) s.lastSeenAt = now;
    next();
  };
}
