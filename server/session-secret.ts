// SESSION_SECRET, or one generated once and kept in .data/session-secret (mode 600), so sessions
// survive restarts without anyone having to configure a secret on a workbench machine.
import { randomBytes } from 'node:crypto';
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { dataDir } from './paths';

/** The secret to sign cookies and CSRF tokens with. */
export function resolveSessionSecret(configured: string | undefined): string {
  if (configured) return configured;
  const dir = dataDir();
  const file = join(dir, 'session-secret');
  if (existsSync(file)) {
    const stored = readFileSync(file, 'utf8').trim();
    if (stored.length >= 32) return stored;
  }
  mkdirSync(dir, { recursive: true });
  const secret = randomBytes(32).toString('base64url');
  writeFileSync(file, `${secret}\n`, { mode: 0o600 });
  return secret;
}
