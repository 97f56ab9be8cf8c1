/**
 * `npm run bench:load`: the running app under HTTP load on loopback (autocannon 9). Starts its own
 * MariaDB (`.data/bench-db`, a free port, a fresh database) and the BUILT server as a child process
 * with the demo shop, then for each target — the reads a shop does most (lists, one record) and
 * sign-in (bcrypt cost 10, as shipped):
 *   1. a fixed request rate (`overallRate`) for BENCH_DURATION_S seconds,
 *   2. BENCH_CONNECTIONS closed-loop connections, BENCH_ROUNDS rounds of BENCH_DURATION_S seconds,
 * and reports requests per second, p50/p99 latency, errors, non-2xx answers with 429s counted
 * apart, and the server's resident memory before and after each round. The whole set runs with the
 * job runner idle and, when the app has the analysis service, again while 10 analyses run.
 * Everything listens on 127.0.0.1 only; every run is bounded by its duration. A benchmark, not a
 * test: prints a markdown report and, with `--write`, puts it in docs/reliability.md.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { existsSync, readFileSync, writeFileSync } from 'node:fs';
import net from 'node:net';
import { cpus, loadavg } from 'node:os';
import { join } from 'node:path';
import autocannon from 'autocannon';
import { startDatabase, type RunningDatabase } from './db';
import { projectRoot } from '../server/paths';
import { hashPassword } from '../server/auth/passwords';
import { createSequelize } from '../server/db/sequelize';
import { Shop, User } from '../server/models';
import { busyPhase, type BusyPhase } from './bench-load-busy';

const DURATION_S = Number(process.env.BENCH_DURATION_S ?? 30);
const ROUNDS = Number(process.env.BENCH_ROUNDS ?? 3);
const CONNECTIONS = Number(process.env.BENCH_CONNECTIONS ?? 50);
/** Fixed rates (requests per second over all connections) this 2-core machine sustains. */
const READ_RATE = Number(process.env.BENCH_READ_RATE ?? 20);
const SIGNIN_RATE = Number(process.env.BENCH_SIGNIN_RATE ?? 2);
const ADMIN = { email: 'adam.admin@demo.crankwise.test', password: 'crank-demo-admin' };
/** Sign-in runs rotate over this many technicians of the demo shop, as a shop's morning does. */
const SIGNIN_USERS = 60;
const SIGNIN_PASSWORD = 'bench-technician-pw';
const signInEmail = (i: number) => `bench.tech.${i}@demo.crankwise.test`;
const HOST = '127.0.0.1';

interface Target {
  name: string;
  kind: 'read' | 'sign-in';
  path: string;
}

interface RunFigures {
  label: string;
  rps: number;
  p50: number;
  p99: number;
  requests: number;
  errors: number;
  timeouts: number;
  non2xx: number;
  tooMany: number;
  rssBeforeMb: number;
  rssAfterMb: number;
}

function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const server = net.createServer();
    server.once('error', reject);
    server.listen(0, HOST, () => {
      const { port } = server.address() as net.AddressInfo;
      server.close(() => resolve(port));
    });
  });
}

/** Resident memory of a process in MB (Linux /proc). */
function rssMb(pid: number): number {
  try {
    const line = readFileSync(`/proc/${pid}/status`, 'utf8').split('\n').find((l) => l.startsWith('VmRSS:'));
    return line ? Number(line.replace(/\D+/g, '')) / 1024 : NaN;
  } catch {
    return NaN;
  }
}

/** The cookies of a response as one Cookie header value. */
function cookiesOf(res: Response, previous = ''): string {
  const jar = new Map(previous ? previous.split('; ').map((c) => c.split('=', 2) as [string, string]) : []);
  for (const raw of res.headers.getSetCookie()) {
    const [pair] = raw.split(';');
    const eq = pair!.indexOf('=');
    jar.set(pair!.slice(0, eq), pair!.slice(eq + 1));
  }
  return [...jar].map(([k, v]) => `${k}=${v}`).join('; ');
}

/** A fresh signed-out session with its CSRF token (one per sign-in request: sign-in renews the session). */
async function csrfSession(base: string): Promise<{ cookie: string; token: string }> {
  const res = await fetch(`${base}/api/csrf`);
  const { token } = (await res.json()) as { token: string };
  return { cookie: cookiesOf(res), token };
}

/** Signs the demo admin in; returns the session cookie and a CSRF token for it. */
async function signIn(base: string): Promise<{ cookie: string; token: string }> {
  const first = await csrfSession(base);
  const res = await fetch(`${base}/api/auth/sign-in`, {
    method: 'POST',
    headers: { 'content-type': 'application/json', cookie: first.cookie, 'x-csrf-token': first.token },
    body: JSON.stringify(ADMIN),
  });
  if (res.status !== 200) throw new Error(`sign-in answered ${res.status}: ${await res.text()}`);
  const cookie = cookiesOf(res, first.cookie);
  const csrf = await fetch(`${base}/api/csrf`, { headers: { cookie } });
  const { token } = (await csrf.json()) as { token: string };
  return { cookie: cookiesOf(csrf, cookie), token };
}

async function waitForHealth(base: string, child: ChildProcess): Promise<void> {
  const deadline = Date.now() + 90_000;
  while (Date.now() < deadline) {
    if (child.exitCode !== null) throw new Error(`the server exited with code ${child.exitCode}`);
    try {
      if ((await fetch(`${base}/api/health`)).ok) return;
    } catch {
      /* not listening yet */
    }
    await new Promise((r) => setTimeout(r, 250));
  }
  throw new Error('the server did not answer /api/health within 90 s');
}

/** One autocannon run; sign-in runs get one fresh CSRF session per request. */
async function run(
  base: string,
  target: Target,
  auth: { cookie: string; token: string },
  label: string,
  opts: { connections: number; overallRate?: number },
  serverPid: number,
): Promise<RunFigures> {
  const rssBeforeMb = rssMb(serverPid);
  let requests: autocannon.Request[];
  if (target.kind === 'sign-in') {
    // Enough sessions for the fastest rate this machine reaches (bcrypt cost 10 bounds it), plus margin.
    const needed = Math.ceil((opts.overallRate ?? 60) * DURATION_S * 1.2) + opts.connections;
    const sessions: { cookie: string; token: string }[] = [];
    for (let i = 0; i < needed; i += 20) sessions.push(...(await Promise.all(Array.from({ length: Math.min(20, needed - i) }, () => csrfSession(base)))));
    let next = 0;
    let who = 0;
    requests = [
      {
        method: 'POST',
        path: target.path,
        setupRequest: (req) => {
          const s = sessions[next++ % sessions.length]!;
          const body = JSON.stringify({ email: signInEmail(who++ % SIGNIN_USERS), password: SIGNIN_PASSWORD });
          return { ...req, headers: { ...req.headers, 'content-type': 'application/json', cookie: s.cookie, 'x-csrf-token': s.token }, body };
        },
      },
    ];
  } else {
    requests = [{ method: 'GET', path: target.path }];
  }
  const result = await autocannon({
    url: base,
    connections: opts.connections,
    overallRate: opts.overallRate,
    duration: DURATION_S,
    headers: target.kind === 'read' ? { cookie: auth.cookie } : {},
    requests,
    timeout: 10,
  });
  const codes = (result as unknown as { statusCodeStats?: Record<string, { count: number }> }).statusCodeStats ?? {};
  if (process.env.BENCH_VERBOSE) console.log(label, JSON.stringify(codes));
  // Each row as soon as it is measured, so a run cut short still leaves its figures.
  console.log(`  ${label}: ${result.requests.average.toFixed(0)} req/s, p50 ${result.latency.p50} ms, p99 ${result.latency.p99} ms, ${result.errors} errors (${result.timeouts} timeouts), ${codes['429']?.count ?? 0} × 429`);
  return {
    label,
    rps: result.requests.average,
    p50: result.latency.p50,
    p99: result.latency.p99,
    requests: result.requests.total,
    errors: result.errors,
    timeouts: result.timeouts,
    non2xx: result.non2xx - (codes['429']?.count ?? 0),
    tooMany: codes['429']?.count ?? 0,
    rssBeforeMb,
    rssAfterMb: rssMb(serverPid),
  };
}

function table(rows: RunFigures[]): string {
  const lines = [
    '| run | req/s | p50 ms | p99 ms | requests | errors | timeouts | non-2xx (not 429) | 429 | server RSS before → after (MB) |',
    '|---|---:|---:|---:|---:|---:|---:|---:|---:|---|',
  ];
  for (const r of rows) {
    lines.push(
      `| ${r.label} | ${r.rps.toFixed(0)} | ${r.p50} | ${r.p99} | ${r.requests} | ${r.errors} | ${r.timeouts} | ${r.non2xx} | ${r.tooMany} | ${r.rssBeforeMb.toFixed(0)} → ${r.rssAfterMb.toFixed(0)} |`,
    );
  }
  return lines.join('\n');
}

async function targetsOf(base: string, auth: { cookie: string }): Promise<Target[]> {
  const get = async (path: string) => {
    const res = await fetch(`${base}${path}`, { headers: { cookie: auth.cookie } });
    return res.ok ? ((await res.json()) as { items?: { id: number }[] }) : null;
  };
  const targets: Target[] = [];
  const cases = await get('/api/cases');
  if (cases) targets.push({ name: 'case list', kind: 'read', path: '/api/cases' });
  const engines = await get('/api/engines');
  if (engines) targets.push({ name: 'engine list', kind: 'read', path: '/api/engines' });
  const engineId = engines?.items?.[0]?.id;
  if (engineId) targets.push({ name: 'one engine (drive document)', kind: 'read', path: `/api/engines/${engineId}` });
  const series = await busySeriesPath(base, auth);
  if (series) targets.push({ name: 'results series', kind: 'read', path: series });
  targets.push({ name: 'sign-in', kind: 'sign-in', path: '/api/auth/sign-in' });
  return targets;
}

/** A results-series path when the app has analyses (filled by the busy phase's seeding), else null. */
async function busySeriesPath(base: string, auth: { cookie: string }): Promise<string | null> {
  return busy?.seriesPath ? busy.seriesPath(base, auth) : null;
}

let busy: BusyPhase | null = null;

/** Technicians for the sign-in runs (one bcrypt hash of cost 10, as the app makes them), added to the demo shop. */
async function addSignInUsers(databaseUrl: string): Promise<void> {
  const sequelize = await createSequelize(databaseUrl);
  try {
    const shop = await Shop.findOne({ where: { isDemo: true } });
    if (!shop) throw new Error('no demo shop in the bench database');
    const passwordHash = await hashPassword(SIGNIN_PASSWORD, 10);
    await User.bulkCreate(
      Array.from({ length: SIGNIN_USERS }, (_, i) => ({ shopId: shop.id, email: signInEmail(i), name: `Bench Technician ${i}`, role: 'tech' as const, passwordHash })),
      { ignoreDuplicates: true },
    );
  } finally {
    await sequelize.close();
  }
}

async function main(): Promise<void> {
  const root = projectRoot();
  const entry = join(root, 'dist', 'node', 'server', 'index.js');
  if (!existsSync(entry)) throw new Error(`${entry} is missing: run npm run build:node first`);
  const write = process.argv.includes('--write');
  let db: RunningDatabase | null = null;
  let server: ChildProcess | null = null;
  const cleanup = async () => {
    if (server && server.exitCode === null) {
      server.kill('SIGTERM');
      await new Promise((r) => server!.once('exit', r));
    }
    await busy?.stop();
    await db?.stop();
  };
  try {
    db = await startDatabase({ name: 'bench-db', port: await freePort(), database: 'crankwise_bench', fresh: true, log: (m) => console.log(`[db] ${m}`) });
    const port = await freePort();
    const base = `http://${HOST}:${port}`;
    const env = {
      ...process.env,
      DATABASE_URL: db.url,
      HOST,
      PORT: String(port),
      MAIL_FAKE_PORT: String(await freePort()),
      DEMO: 'on',
      NODE_ENV: 'production',
      LOG_LEVEL: 'warn',
      // Bench-only limiter setting: sign-ins that time out under 50 connections count as failures
      // and would trip the per-IP limit for the rest of the run (429s are still counted apart).
      SIGNIN_IP_MAX_FAILURES: '1000000',
      SIGNIN_MAX_FAILURES: '1000000',
    };
    server = spawn(process.execPath, [entry], { cwd: root, env, stdio: ['ignore', 'ignore', 'inherit'] });
    await waitForHealth(base, server);
    const auth = await signIn(base);
    await addSignInUsers(db.url);
    busy = await busyPhase({ root, databaseUrl: db.url, base, auth });
    const sections: string[] = [];
    const phases: { name: string; start?: () => Promise<void> }[] = [{ name: 'job runner idle' }];
    if (busy) phases.push({ name: `while ${busy.analyses} analyses run`, start: () => busy!.start() });
    for (const phase of phases) {
      await phase.start?.();
      const rows: RunFigures[] = [];
      for (const target of await targetsOf(base, auth)) {
        const rate = target.kind === 'sign-in' ? SIGNIN_RATE : READ_RATE;
        console.log(`${phase.name}: ${target.name}, ${rate}/s fixed for ${DURATION_S} s`);
        rows.push(await run(base, target, auth, `${target.name}: ${rate}/s fixed`, { connections: 10, overallRate: rate }, server.pid!));
        for (let round = 1; round <= ROUNDS; round++) {
          console.log(`${phase.name}: ${target.name}, ${CONNECTIONS} connections, round ${round}/${ROUNDS}`);
          rows.push(await run(base, target, auth, `${target.name}: ${CONNECTIONS} conn., round ${round}`, { connections: CONNECTIONS }, server.pid!));
        }
      }
      sections.push(`#### ${phase.name}${busy && phase.start ? ` (${busy.describe()})` : ''}\n\n${table(rows)}`);
      if (phase.start) await Promise.race([busy?.stop(), new Promise((r) => setTimeout(r, 30_000))]);
    }
    const report = [
      `Run ${new Date().toISOString().slice(0, 16).replace('T', ' ')} UTC on ${cpus().length} × ${cpus()[0]?.model.trim()}, load average ${loadavg()[0]!.toFixed(1)} at the end;`,
      `Node ${process.version}; ${DURATION_S} s per run; fixed rates ${READ_RATE}/s (reads, 10 connections) and ${SIGNIN_RATE}/s (sign-in);`,
      `closed loop ${CONNECTIONS} connections × ${ROUNDS} rounds. Latency in ms (autocannon's histogram, 1 ms resolution).`,
      '',
      ...sections.flatMap((s) => [s, '']),
    ].join('\n');
    console.log(`\n${report}`);
    if (write) {
      const file = join(root, 'docs', 'reliability.md');
      const doc = readFileSync(file, 'utf8');
      const begin = '<!-- load:begin -->';
      const end = '<!-- load:end -->';
      if (!doc.includes(begin) || !doc.includes(end)) throw new Error(`docs/reliability.md lacks the ${begin} … ${end} markers`);
      writeFileSync(file, `${doc.slice(0, doc.indexOf(begin) + begin.length)}\n${report}\n${doc.slice(doc.indexOf(end))}`);
      console.log('written to docs/reliability.md');
    }
  } finally {
    await cleanup();
  }
}

main().catch((error: unknown) => {
  console.error(error instanceof Error ? error.message : String(error));
  process.exit(1);
});
