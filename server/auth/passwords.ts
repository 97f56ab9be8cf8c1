// Password hashing with bcryptjs (pure JS, no native addon).
import bcrypt from 'bcryptjs';
import { randomBytes } from 'node:crypto';

let dummyHash: Promise<string> | null = null;

/** Hashes a password with bcrypt at `rounds` (BCRYPT_ROUNDS, default 10). */
export function hashPassword(password: string, rounds: number): Promise<string> {
  return bcrypt.hash(password, rounds);
}

/**
 * Compares a password with a stored hash. With `hash` null (unknown user) it compares against a
 * dummy hash of the same cost, so an unknown e-mail takes about as long as a wrong password.
 */
export async function verifyPassword(password: string, hash: string | null, rounds: number): Promise<boolean> {
  if (hash === null) {
    dummyHash ??= bcrypt.hash(randomBytes(16).toString('hex'), rounds);
    await bcrypt.compare(password, await dummyHash);
    return false;
  }
  return bcrypt.compare(password, hash);
}
