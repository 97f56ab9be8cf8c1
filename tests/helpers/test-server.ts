// Spawns the BUILT server (`node dist/node/server/index.js`, so run `npm run build` first; `npm test`
// does) against the e2e test database from the global set-up, with the demo shop on and the mail
// fake on a free port. Waits for /api/health. Used by the browser tests in tests/e2e/.
import { spawn } from 'node:child_process';
import { existsSync } from 'node:fs';
import net from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { inject } from 'vitest';
import { projectRoot } from '../../server/paths';

/** Options for {@link startTestServer}. */
export interface TestServerOptions {
  /** HTTP port on 127.0.0.1 (default 3100). */
  port?: number;
  /** Extra environment (strings), e.g. `{ DEMO: 'off' }`. */
  env?: Record<string, string>;
  /** How long to wait for /api/health (default 60 s). */
  timeoutMs?: number;
}

/** A running built server. */
export interface TestServer {
  baseUrl: string;
  /** SMTP URL of its mail fake (messages land in the e2e database's mail_messages). */
  mailUrl: string;
  stop(): Promise<void>;
}

/** A free TCP port on 127.0.0.1, found by binding port 0. */
export function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const server = net.createServer();
    server.once('error', reject);
    server.listen(0, '127.0.0.1', () => {
      const { port } = server.address() as net.AddressInfo;
      server.close(() => resolve(port));
    });
  });
}

function databaseUrl(): string {
  try {
    return inject('e2eDatabaseUrl');
  } catch {
    const fromEnv = process.env.TEST_E2E_DATABASE_URL;
    if (!fromEnv) throw new Error('No e2e database: run under vitest with tests/setup/global-db.ts as globalSetup');
    return fromEnv;
  }
}

/** Starts the built server and resolves once it answers /api/health. */
export async function startTestServer(options: TestServerOptions = {}): Promise<TestServer> {
  const root = projectRoot();
  const entry = join(root, 'dist', 'node', 'server', 'index.js');
  if (!existsSync(entry)) throw new Error(`${entry} is missing: run \`npm run build\` first`);
  const port = options.port ?? 3100;
  const mailPort = await freePort();
  const baseUrl = `http://127.0.0.1:${port}`;
  const child = spawn(process.execPath, [entry], {
    cwd: root,
    env: {
      PATH: process.env.PATH ?? '',
      HOME: process.env.HOME ?? root,
      NODE_ENV: 'test',
      HOST: '127.0.0.1',
      PORT: String(port),
      PUBLIC_URL: baseUrl,
      DATABASE_URL: databaseUrl(),
      DEMO: 'on',
      // Capture files of this run (the demo cases' included) stay out of the checkout's .data/.
      STORAGE_DIR: join(tmpdir(), `crankwise-e2e-captures-${process.pid}`),
      MAIL_FAKE_PORT: String(mailPort),
      SESSION_SECRET: 'e2e-session-secret-e2e-session-secret-0123',
      LOG_LEVEL: 'warn',
      ...options.env,
    },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let output = '';
  const keep = (chunk: Buffer) => {
    output = (output + chunk.toString()).slice(-4000);
  };
  child.stdout.on('data', keep);
  child.stderr.on('data', keep);
  const exited = new Promise<void>((resolve) => child.once('exit', () => resolve()));

  const stop = async () => {
    if (child.exitCode !== null || child.signalCode !== null) return;
    child.kill('SIGTERM');
    const timer = setTimeout(() => child.kill('SIGKILL'), 10_000);
    await exited;
    clearTimeout(timer);
  };

  const deadline = Date.now() + (options.timeoutMs ?? 60_000);
  for (;;) {
    if (child.exitCode !== null) throw new Error(`the built server exited with code ${child.exitCode}:\n${output}`);
    try {
      const res = await fetch(`${baseUrl}/api/health`);
      if (res.ok) break;
    } catch {
      // not listening yet
    }
    if (Date.now() > deadline) {
      await stop();
      throw new Error(`the built server did not answer ${baseUrl}/api/health in time:\n${output}`);
    }
    await new Promise((r) => setTimeout(r, 200));
  }
  return { baseUrl, mailUrl: `smtp://127.0.0.1:${mailPort}`, stop };
}
