/**
 * The "while analyses run" phase of `npm run bench:load`: when the app has the analysis service,
 * it opens a case in the demo shop and uploads 10 captures (tests/fixtures/bad/valid-capture.wav);
 * from start() on it keeps 10 analyses queued or running by asking for re-runs
 * (POST /api/captures/:id/analyses) as earlier ones finish, so the job runner and its worker pool
 * stay busy during every run of the phase. Without the analysis service it returns null.
 */
import { readFile } from 'node:fs/promises';
import { join } from 'node:path';

/** What bench-load.ts needs from the busy phase. */
export interface BusyPhase {
  /** How many analyses are kept running during the phase. */
  analyses: number;
  start(): Promise<void>;
  stop(): Promise<void>;
  describe(): string;
  /** A results-series path to read, or null. */
  seriesPath?(base: string, auth: { cookie: string }): Promise<string | null>;
}

/** Options from bench-load.ts. */
export interface BusyOptions {
  root: string;
  databaseUrl: string;
  base: string;
  auth: { cookie: string; token: string };
}

const ANALYSES = 10;

/** The busy phase for this app, or null when it has no analysis service. */
export async function busyPhase(options: BusyOptions): Promise<BusyPhase | null> {
  const { base, auth } = options;
  const headers = { cookie: auth.cookie, 'x-csrf-token': auth.token };
  const json = async (method: string, path: string, body?: unknown) => {
    const res = await fetch(`${base}${path}`, { method, headers: { ...headers, ...(body ? { 'content-type': 'application/json' } : {}) }, body: body ? JSON.stringify(body) : undefined });
    return { status: res.status, body: (await res.json().catch(() => ({}))) as Record<string, any> };
  };
  if ((await json('GET', '/api/cases')).status === 404) return null;
  const engines = await json('GET', '/api/engines');
  const me = await json('GET', '/api/auth/me');
  const created = await json('POST', '/api/cases', {
    roNumber: 'RO-BENCH-1', vehicle: { year: 2018, make: 'Nordfahrt', model: 'Kestrel' }, complaint: 'Bench: a whine to analyse',
    engineId: engines.body.items?.[0]?.id ?? null, leadId: me.body.user?.id ?? null,
  });
  if (created.status !== 201) throw new Error(`bench: could not open a case (${created.status} ${JSON.stringify(created.body)})`);
  const caseId = created.body.case.id as number;
  const bytes = await readFile(join(options.root, 'tests', 'fixtures', 'bad', 'valid-capture.wav'));
  const metadata = {
    channels: [{ role: 'reference', scale: 1, unit: 'V' }, { role: 'pickup', scale: 1, unit: 'g' }],
    reference: { kind: 'cyl1', polarity: 'auto', tdcOffsetDeg: 0, perCycle: null }, sensorKind: 'accelerometer',
    probePoint: { label: 'alternator front housing', component: 'Alternator' },
    condition: { speed: 'idle', acClutch: 'off', electricalLoad: 'unknown', beltOff: false }, phase: 'before', source: 'upload',
  };
  const captures: { id: number; analysis: { id: number } }[] = [];
  for (let batch = 0; batch < ANALYSES; batch += 5) {
    const form = new FormData();
    const n = Math.min(5, ANALYSES - batch);
    form.append('metadata', JSON.stringify(Array.from({ length: n }, () => metadata)));
    for (let i = 0; i < n; i++) form.append('files', new Blob([bytes]), `bench-${batch + i}.wav`);
    const uploaded = await fetch(`${base}/api/cases/${caseId}/captures`, { method: 'POST', headers, body: form });
    if (uploaded.status !== 201) throw new Error(`bench: upload answered ${uploaded.status}: ${await uploaded.text()}`);
    captures.push(...((await uploaded.json()) as { captures: { id: number; analysis: { id: number } }[] }).captures);
  }
  const pending = new Map(captures.map((c) => [c.id, c.analysis.id]));
  // The first analyses of the uploads run now, so the idle phase starts with the runner idle.
  for (const analysisId of pending.values()) {
    for (let i = 0; i < 1200; i++) {
      const status = (await json('GET', `/api/analyses/${analysisId}`)).body.analysis?.status;
      if (status === 'done' || status === 'failed') break;
      await new Promise((r) => setTimeout(r, 250));
    }
  }
  let running = false;
  let rerun = 0;
  let loop: Promise<void> | null = null;
  const keepBusy = async () => {
    while (running) {
      for (const [captureId, analysisId] of pending) {
        const a = await json('GET', `/api/analyses/${analysisId}`);
        const status = a.body.analysis?.status;
        if (running && (status === 'done' || status === 'failed')) {
          const next = await json('POST', `/api/captures/${captureId}/analyses`, { settings: {} });
          if (next.status === 202) { pending.set(captureId, next.body.analysis.id); rerun += 1; }
        }
      }
      await new Promise((r) => setTimeout(r, 300));
    }
  };
  return {
    analyses: ANALYSES,
    async start() {
      running = true;
      loop = keepBusy();
    },
    async stop() {
      running = false;
      await loop;
    },
    describe: () => `${ANALYSES} captures of 4 s at 8 kHz kept queued or running; ${rerun} re-runs asked so far`,
    async seriesPath() {
      const first = [...pending.values()][0]!;
      const a = await json('GET', `/api/analyses/${first}`);
      return a.body.analysis?.status === 'done' ? `/api/analyses/${first}/series/orders` : null;
    },
  };
}
