// Helpers of the fault tests: a MariaDB of the test's own (own data directory and port, so it can be
// stopped and started without touching anyone else's), the BUILT server as a child process that can
// be killed, and a small cookie-keeping HTTP client.
import { spawn, type ChildProcess } from 'node:child_process';
import { existsSync } from 'node:fs';
import { join } from 'node:path';
import { startDatabase, type RunningDatabase } from '../../scripts/db';
import { projectRoot } from '../../server/paths';
import { freePort } from '../helpers/test-server';

export const root = projectRoot();

/** Starts (fresh) or restarts (keeping its data) the test's own MariaDB. */
export function ownDatabase(name: string, port: number, fresh: boolean): Promise<RunningDatabase> {
  return startDatabase({ name, port, database: 'crankwise', fresh });
}

/** A running built server. */
export interface ServerProcess {
  base: string;
  child: ChildProcess;
  stderr: () => string;
  kill(signal?: NodeJS.Signals): Promise<void>;
}

/** Spawns dist/node/server/index.js and waits for /api/health. */
export async function startServer(env: Record<string, string>, port?: number): Promise<ServerProcess> {
  const entry = join(root, 'dist', 'node', 'server', 'index.js');
  if (!existsSync(entry)) throw new Error(`${entry} is missing: run npm run build:node`);
  const p = port ?? (await freePort());
  const base = `http://127.0.0.1:${p}`;
  const child = spawn(process.execPath, [entry], {
    cwd: root,
    env: { ...process.env, NODE_ENV: 'test', HOST: '127.0.0.1', PORT: String(p), MAIL_FAKE_PORT: String(await freePort()), LOG_LEVEL: 'error', BCRYPT_ROUNDS: '4', DEMO: 'off', MAIL_URL: '', ...env },
    stdio: ['ignore', 'ignore', 'pipe'],
  });
  let stderr = '';
  child.stderr!.on('data', (d) => (stderr += String(d)));
  const deadline = Date.now() + 120_000;
  for (;;) {
    if (child.exitCode !== null) throw new Error(`the server exited (${child.exitCode}): ${stderr}`);
    try {
      if ((await fetch(`${base}/api/health`)).ok) break;
    } catch {
      /* not listening yet */
    }
    if (Date.now() > deadline) throw new Error(`the server did not start: ${stderr}`);
    await new Promise((r) => setTimeout(r, 200));
  }
  return {
    base,
    child,
    stderr: () => stderr,
    async kill(signal = 'SIGKILL') {
      if (child.exitCode !== null || child.signalCode !== null) return;
      const exited = new Promise((r) => child.once('exit', r));
      child.kill(signal);
      await exited;
    },
  };
}

/** A cookie-keeping JSON client with the CSRF token. */
export class Client {
  cookie = '';
  token = '';
  constructor(public base: string) {}

  private keep(res: Response): void {
    const jar = new Map(this.cookie ? this.cookie.split('; ').map((c) => [c.slice(0, c.indexOf('=')), c.slice(c.indexOf('=') + 1)]) : []);
    for (const raw of res.headers.getSetCookie()) {
      const pair = raw.split(';')[0]!;
      jar.set(pair.slice(0, pair.indexOf('=')), pair.slice(pair.indexOf('=') + 1));
    }
    this.cookie = [...jar].map(([k, v]) => `${k}=${v}`).join('; ');
  }

  async send(method: string, path: string, body?: unknown): Promise<{ status: number; body: Record<string, any> }> {
    const res = await fetch(`${this.base}${path}`, {
      method,
      headers: { cookie: this.cookie, 'x-csrf-token': this.token, ...(body !== undefined && !(body instanceof FormData) ? { 'content-type': 'application/json' } : {}) },
      body: body === undefined ? undefined : body instanceof FormData ? body : JSON.stringify(body),
    });
    this.keep(res);
    const text = await res.text();
    let parsed: Record<string, any> = {};
    try {
      parsed = text ? JSON.parse(text) : {};
    } catch {
      parsed = { text };
    }
    return { status: res.status, body: parsed };
  }

  async csrf(): Promise<void> {
    this.token = (await this.send('GET', '/api/csrf')).body.token as string;
  }

  /** First-run set-up (a fresh database has no shop), then signed in as its admin. */
  async setUpShop(): Promise<void> {
    await this.csrf();
    const res = await this.send('POST', '/api/setup', { shopName: 'Fault Garage', adminName: 'Faye Admin', adminEmail: 'faye@fault.test', password: 'fault-admin-password' });
    if (res.status !== 201 && res.status !== 200) throw new Error(`setup answered ${res.status} ${JSON.stringify(res.body)}`);
    await this.signIn();
  }

  async signIn(): Promise<void> {
    this.cookie = '';
    await this.csrf();
    const res = await this.send('POST', '/api/auth/sign-in', { email: 'faye@fault.test', password: 'fault-admin-password' });
    if (res.status !== 200) throw new Error(`sign-in answered ${res.status} ${JSON.stringify(res.body)}`);
    await this.csrf();
  }
}

/** Waits until `check` is truthy (bounded), returning its value. */
export async function until<T>(what: string, check: () => Promise<T | null | undefined | false>, timeoutMs = 120_000): Promise<T> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const v = await check().catch(() => null);
    if (v) return v;
    if (Date.now() > deadline) throw new Error(`${what}: not within ${timeoutMs / 1000} s`);
    await new Promise((r) => setTimeout(r, 250));
  }
}

export { freePort };
