import { randomBytes, createHash } from 'node:crypto';

/** A single-use link token: the raw value goes in the e-mail, only its SHA-256 is stored. */
export function newLinkToken(): { raw: string; hash: string } {
  const raw = randomBytes(32).toString('base64url');
  return { raw, hash: hashToken(raw) };
}

export function hashToken(raw: string): string {
  return createHash('sha256').update(raw).digest('hex');
}
