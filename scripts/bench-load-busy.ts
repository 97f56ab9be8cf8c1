/**
 * The "while analyses run" phase of `npm run bench:load`: when the app has the analysis service
 * (cases, capture uploads and the job runner), it seeds a case with captures and, at start(),
 * queues analyses so that the job runner and its worker pool are busy during the runs. Without the
 * analysis service it returns null and the bench runs only with the pool idle.
 */

/** What bench-load.ts needs from the busy phase. */
export interface BusyPhase {
  /** How many analyses run during the phase. */
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

/** The busy phase for this app, or null when it has no analysis service. */
export async function busyPhase(options: BusyOptions): Promise<BusyPhase | null> {
  const res = await fetch(`${options.base}/api/cases`, { headers: { cookie: options.auth.cookie } });
  if (res.status === 404) return null;
  return null;
}
