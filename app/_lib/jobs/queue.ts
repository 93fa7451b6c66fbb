import 'server-only';
import PgBoss from 'pg-boss';
import { databaseUrl } from '../server/database-url';

/**
 * The pg-boss wiring: background jobs on PostgreSQL (schema `pgboss`). One PgBoss instance per
 * process, its start promise cached on globalThis like the ORM's. Jobs live in the database, so a
 * job sent before a restart is picked up by the next process; pg-boss retries a failed job and
 * takes a running job for dead when it expires.
 *
 * Owns: the PgBoss instance and its pool, the queue and its retry and expiry policy, the message a
 * job carries (the id of its `import_job` row, which is also the pg-boss job's id), sending,
 * working, cancelling and failing pg-boss jobs. May import: pg-boss, server/database-url. It never
 * touches `import_job` (jobs/job-store.ts does) and runs no import (jobs/sensor-import-job.ts
 * gives it the handler).
 */

export const SENSOR_IMPORT_QUEUE = 'sensor-import';
/** A running import that takes longer than this is taken for dead and retried. */
const EXPIRE_S = 15 * 60;
const RETRY_LIMIT = 2;

interface SensorImportData {
  importJobId: string;
}

/** How many times a job has been tried, and how many retries it has. */
export interface JobAttempt {
  retryCount: number;
  retryLimit: number;
}

const g = globalThis as typeof globalThis & { __emberlineBoss?: Promise<PgBoss> };

/** A new, unstarted PgBoss on the database URL (schema `pgboss`). Most code wants getBoss(). */
export function newBoss(): PgBoss {
  const boss = new PgBoss({ connectionString: databaseUrl(), schema: 'pgboss', max: 3, application_name: 'emberline-jobs' });
  boss.on('error', (e) => console.error('jobs:', e.message));
  return boss;
}

/** Starts a PgBoss and makes sure the queue exists (idempotent). */
export async function startBoss(boss: PgBoss, queue = SENSOR_IMPORT_QUEUE): Promise<PgBoss> {
  await boss.start();
  await boss.createQueue(queue, { name: queue, retryLimit: RETRY_LIMIT, retryDelay: 5, expireInSeconds: EXPIRE_S });
  return boss;
}

/** The process's PgBoss, started once; the promise is cached before any await. */
export function getBoss(): Promise<PgBoss> {
  if (!g.__emberlineBoss) {
    g.__emberlineBoss = startBoss(newBoss()).catch((e: unknown) => {
      g.__emberlineBoss = undefined;
      throw e;
    });
  }
  return g.__emberlineBoss;
}

/** Sends the pg-boss job of an import job row (same id). */
export async function enqueueSensorImport(boss: PgBoss, importJobId: string, queue = SENSOR_IMPORT_QUEUE): Promise<void> {
  await boss.send(queue, { importJobId } satisfies SensorImportData, { id: importJobId, retryLimit: RETRY_LIMIT, retryDelay: 5, expireInSeconds: EXPIRE_S });
}

/** Registers a worker on a started PgBoss, one job at a time; a handler that throws makes pg-boss retry. Returns the worker id. */
export function workQueue(boss: PgBoss, queue: string, run: (importJobId: string, attempt: JobAttempt) => Promise<void>): Promise<string> {
  return boss.work<SensorImportData>(queue, { batchSize: 1, pollingIntervalSeconds: 1, includeMetadata: true }, async ([job]) => {
    await run(job.data.importJobId, { retryCount: job.retryCount, retryLimit: job.retryLimit });
  });
}

/** Those of `ids` whose pg-boss job is taken (`active`): a worker has it, or had it when its process died. */
export async function activeJobIds(boss: PgBoss, queue: string, ids: string[]): Promise<string[]> {
  const active: string[] = [];
  for (const id of ids) if ((await boss.getJobById(queue, id))?.state === 'active') active.push(id);
  return active;
}

/**
 * Hands a taken job back to pg-boss at once (as a failure, so it is retried without waiting for
 * its expiry). Returns false when pg-boss has no retry left for it (the job is failed for good).
 */
export async function handBack(boss: PgBoss, queue: string, id: string): Promise<boolean> {
  await boss.fail(queue, id, { message: 'interrupted by a restart' });
  const j = await boss.getJobById(queue, id);
  return !(j && j.state === 'failed');
}

/** Cancels a job that no worker has taken; best effort (a worker skips a cancelled job row anyway). */
export async function cancelQueued(id: string, queue = SENSOR_IMPORT_QUEUE): Promise<void> {
  try {
    await (await getBoss()).cancel(queue, id);
  } catch {
    /* the worker sees the cancelled row and skips it */
  }
}
