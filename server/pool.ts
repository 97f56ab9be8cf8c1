import { availableParallelism } from 'node:os';
import { join } from 'node:path';
import { Piscina } from 'piscina';
import { type TaskMap, type TaskName } from '../shared/tasks';
import { projectRoot } from './paths';

/**
 * The one Piscina pool of the server process (DEVELOPERS.md "Workers and the job runner"). Workers load the built JavaScript
 * (dist/node/workers/analysis.js, made by `npm run build:node`): Node 20 cannot load .ts in a
 * worker thread. One thread per core but one, at least one; created on first use.
 */
let pool: Piscina | null = null;

/** Path of the built worker file. */
export function workerFile(): string {
  return join(projectRoot(), 'dist', 'node', 'workers', 'analysis.js');
}

/** Threads of the pool: POOL_THREADS when set (1–64), else one per core but one, at least one. */
export function poolThreads(): number {
  const given = Number(process.env.POOL_THREADS);
  if (Number.isInteger(given) && given >= 1 && given <= 64) return given;
  return Math.max(1, availableParallelism() - 1);
}

/** The pool, created on first use. */
export function getPool(): Piscina {
  if (!pool) {
    pool = new Piscina({
      filename: workerFile(),
      maxThreads: poolThreads(),
      minThreads: 0,
      idleTimeout: 30_000,
    });
  }
  return pool;
}

/** Runs one task on the pool, typed from the task map. Rejects with the worker's error. */
export function runTask<K extends TaskName>(name: K, input: TaskMap[K]['input']): Promise<TaskMap[K]['output']> {
  return getPool().run(input, { name });
}

/** Stops the pool's threads (tests, shutdown). */
export async function closePool(): Promise<void> {
  if (pool) {
    const p = pool;
    pool = null;
    await p.destroy();
  }
}
