/**
 * The job runner (issue 15 item 5, STYLE.md §4): a few claim loops, each claiming one analysis job
 * at a time from MariaDB and running it on the piscina pool. It runs inside the server process
 * (JOBS_IN_PROCESS, the default) and alone in `npm run jobs` processes on any number of machines
 * sharing the database and the object storage. Never re-queues every running job at start-up:
 * another process may own it; expired leases are the only way back (claim.ts).
 */
import { hostname } from 'node:os';
import { randomBytes } from 'node:crypto';
import type { Sequelize } from 'sequelize';
import type { AnalyzeFileInput, AnalyzeFileOutput } from '../../shared/tasks';
import type { Logger } from '../logger';
import type { ObjectStorage } from '../storage/storage';
import { type JobOutcome, runClaimedJob } from './analysis-job';
import { claimJob } from './claim';

/** How a runner is set up. */
export interface JobRunnerOptions {
  sequelize: Sequelize;
  storage: ObjectStorage;
  logger: Logger;
  analyze: (input: AnalyzeFileInput) => Promise<AnalyzeFileOutput>;
  /** Jobs run at once (claim loops). */
  concurrency: number;
  leaseMs: number;
  pollMs: number;
  /** Lease holder name; default host:pid:random. */
  holder?: string;
  /** Called after each job this runner ran (tests, bench, logs). */
  onJob?: (id: number, outcome: JobOutcome) => void;
}

/** A running runner. */
export interface JobRunner {
  readonly holder: string;
  /** Jobs this runner finished, by outcome. */
  readonly counts: Record<JobOutcome, number>;
  /** Looks for work now instead of at the next poll (after an upload). */
  wake(): void;
  /** Stops claiming and waits for the running jobs to end. */
  stop(): Promise<void>;
}

/** Starts the claim loops. */
export function startJobRunner(options: JobRunnerOptions): JobRunner {
  const holder = options.holder ?? `${hostname()}:${process.pid}:${randomBytes(3).toString('hex')}`;
  const counts: Record<JobOutcome, number> = { done: 0, failed: 0, abandoned: 0, lost: 0 };
  const log = options.logger.child({ component: 'jobs', holder });
  let stopped = false;
  const sleepers = new Set<() => void>();
  const sleep = (ms: number) => new Promise<void>((resolve) => {
    const wake = () => { clearTimeout(timer); sleepers.delete(wake); resolve(); };
    const timer = setTimeout(wake, ms);
    sleepers.add(wake);
  });
  const deps = { sequelize: options.sequelize, storage: options.storage, logger: options.logger, holder, leaseMs: options.leaseMs, analyze: options.analyze };
  const loop = async () => {
    while (!stopped) {
      let id: number | null = null;
      try {
        id = await claimJob(options.sequelize, holder, options.leaseMs);
      } catch (error) {
        if (!stopped) log.warn('claiming a job failed; trying again', { error });
      }
      if (id === null) {
        if (!stopped) await sleep(options.pollMs);
        continue;
      }
      let outcome: JobOutcome = 'abandoned';
      try {
        outcome = await runClaimedJob(deps, id);
      } catch (error) {
        log.error('job failed unexpectedly; it is retried when its lease expires', { analysisId: id, error });
      }
      counts[outcome] += 1;
      options.onJob?.(id, outcome);
    }
  };
  const loops = Array.from({ length: Math.max(1, options.concurrency) }, () => loop());
  log.info('job runner started', { concurrency: options.concurrency, leaseMs: options.leaseMs });
  return {
    holder,
    counts,
    wake() {
      for (const w of [...sleepers]) w();
    },
    async stop() {
      stopped = true;
      for (const w of [...sleepers]) w();
      await Promise.all(loops);
    },
  };
}
