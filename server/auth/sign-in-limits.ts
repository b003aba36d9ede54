import type { Request } from 'express';
import type { Sequelize } from 'sequelize';
import { RateLimiterPostgres, RateLimiterRes } from 'rate-limiter-flexible';
import { AppError } from '../lib/errors';

// Guessing passwords, and mailing someone reset links over and over, are limited per address and
// e-mail in PostgreSQL (rate-limiter-flexible), so every app server counts the same attempts and
// a restart forgets none. Only failed sign-ins count; a successful one clears the count, so a
// shop whose phones share one address is never locked out by its own staff signing in.

const WINDOW_SECONDS = 15 * 60;

const keyOf = (req: Request, email: string) => `${req.ip ?? 'unknown'}|${email.trim().toLowerCase()}`;

function tooMany(res: RateLimiterRes, what: string): AppError {
  const minutes = Math.max(1, Math.ceil(res.msBeforeNext / 60_000));
  return new AppError(429, 'rate_limited', `Too many ${what}. Wait ${minutes} minute${minutes === 1 ? '' : 's'}, or reset your password.`);
}

export interface SignInLimits {
  /** Refuses with 429 when this address has failed too often for this e-mail. */
  check(req: Request, email: string): Promise<void>;
  failed(req: Request, email: string): Promise<void>;
  succeeded(req: Request, email: string): Promise<void>;
  /** Counts a reset request (every one counts) and refuses with 429 past the limit. */
  resetRequested(req: Request, email: string): Promise<void>;
}

export function signInLimits(sequelize: Sequelize, limit: number): SignInLimits {
  const store = (keyPrefix: string) => new RateLimiterPostgres({
    storeClient: sequelize, tableName: 'rate_limits', tableCreated: true, keyPrefix, points: limit, duration: WINDOW_SECONDS,
  });
  const signIn = store('sign-in');
  const reset = store('reset');
  const consume = async (limiter: RateLimiterPostgres, key: string, what: string) => {
    try {
      await limiter.consume(key);
    } catch (e) {
      if (e instanceof RateLimiterRes) throw tooMany(e, what);
      throw e;
    }
  };
  return {
    async check(req, email) {
      const now = await signIn.get(keyOf(req, email));
      if (now && now.consumedPoints >= limit) throw tooMany(now, 'failed sign-ins');
    },
    failed: (req, email) => consume(signIn, keyOf(req, email), 'failed sign-ins'),
    async succeeded(req, email) {
      await signIn.delete(keyOf(req, email));
    },
    resetRequested: (req, email) => consume(reset, keyOf(req, email), 'reset requests'),
  };
}
