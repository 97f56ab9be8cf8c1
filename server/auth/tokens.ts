// One-time tokens for e-mailed links: 32 random bytes (base64url) sent, only their sha256 stored.
import { createHash, randomBytes } from 'node:crypto';

/** A new token and the hash to store. */
export function newToken(): { token: string; tokenHash: string } {
  const token = randomBytes(32).toString('base64url');
  return { token, tokenHash: hashToken(token) };
}

/** The sha256 (hex) of a token, as stored in invites and password_resets. */
export function hashToken(token: string): string {
  return createHash('sha256').update(token, 'utf8').digest('hex');
}
