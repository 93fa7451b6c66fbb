import 'server-only';
import type { EntityManager } from '@mikro-orm/postgresql';
import type PgBoss from 'pg-boss';
import type { ImportJobRow, RigRow, SourceFileRow, UserRow } from '@/entities';
import { getEm } from '../server/db';
import { ImportError } from '../imports/import-error';
import { AlreadyImported, ImportCancelled, importSensorLog, type LogImportInput } from '../imports/sensor-import';
import {
  JOB_HEARTBEAT_S, JOB_LEASE_S, JOB_RECOVERY_SWEEP_S, claimImportJob, completeImportJob, createImportJob, endImportJob, giveUpInterruptedJob, heartbeat, recordProgress,
  requestCancel, requeueInterruptedJobs, retryImportJob,
} from './job-store';
import { SENSOR_IMPORT_QUEUE, activeJobIds, cancelQueued, enqueueSensorImport, getBoss, handBack, workQueue, type JobAttempt } from './queue';

/**
 * The sensor-log import as a background job: started by POST …/log-import, run by the worker that
 * starts with the web server (instrumentation.ts), followed by the page through GET /api/jobs/{id}.
 * A job that was running when its process died (a restart, a SIGKILL, a lost machine) is found by
 * any live worker (`recoverInterruptedJobs`, every `JOB_RECOVERY_SWEEP_S` = 5 s, once its lease of
 * `JOB_LEASE_S` = 15 s has run out: the running worker renews it every `JOB_HEARTBEAT_S` = 5 s) and run
 * again — or, at the latest, retried when pg-boss sees it expire. The import is one transaction, so a half-done attempt left nothing to clean up.
 *
 * Owns: what starting, running, cancelling and recovering an import job means, in terms of the
 * job store and the queue. May import: jobs/job-store, jobs/queue, imports/sensor-import,
 * imports/import-error, server/db. It writes no SQL itself and builds no HTTP answers.
 */

/**
 * Records the job and sends it to the queue. When the queue cannot take it, the job ends
 * `failed` and the error is rethrown.
 * @throws DomainError (job-store `createImportJob`) when the file cannot be imported now
 */
export async function startSensorImport(em: EntityManager, rig: RigRow, file: SourceFileRow, user: UserRow, input: LogImportInput): Promise<ImportJobRow> {
  const job = await createImportJob(em, rig, file, user, input);
  try {
    await enqueueSensorImport(await getBoss(), job.id);
  } catch (e) {
    await endImportJob(job.id, 'failed', 'The job queue is not available; try again.');
    throw e;
  }
  return job;
}

/**
 * Runs one import job: claims it, imports (one transaction) with its progress and cancellation in
 * the job row, and records the outcome. Refusals of the file (a bad row, a bad mapping) and
 * cancellation end the job; other errors are rethrown so that pg-boss retries, while the row says so.
 */
export async function runSensorImportJob(importJobId: string, attempt: JobAttempt = { retryCount: 0, retryLimit: 0 }): Promise<void> {
  const job = await claimImportJob(await getEm(), importJobId);
  if (!job) return;
  const file = job.sourceFile;
  const beat = setInterval(() => void heartbeat(job.id).catch(() => undefined), JOB_HEARTBEAT_S * 1000);
  try {
    const result = await importSensorLog(
      { fileId: file.id, rigId: job.rig.id, labId: job.lab.id, filename: file.filename, storageKey: file.storageKey, sizeBytes: file.sizeBytes, uploadedAt: file.createdAt },
      job.input as unknown as LogImportInput,
      { onProgress: (p) => recordProgress(job.id, p) },
    );
    await completeImportJob(job.id, result);
  } catch (e) {
    if (e instanceof ImportCancelled) return endImportJob(job.id, 'cancelled', e.message);
    if (e instanceof ImportError || e instanceof AlreadyImported) return endImportJob(job.id, 'failed', e.message);
    const last = attempt.retryCount >= attempt.retryLimit;
    console.error(`sensor import ${job.id} failed${last ? '' : ' (will retry)'}:`, e);
    await retryImportJob(job.id, last);
    throw e;
  } finally {
    clearInterval(beat);
  }
}

/** Registers the sensor-import worker on a started PgBoss; returns the worker id. */
export function workSensorImports(boss: PgBoss, queue = SENSOR_IMPORT_QUEUE): Promise<string> {
  return workQueue(boss, queue, runSensorImportJob);
}

/**
 * Finds imports that were running in a process that has gone (job-store `requeueInterruptedJobs`)
 * and hands them back to pg-boss at once, instead of waiting for their expiry; a job pg-boss will
 * not retry any more ends `failed`. Returns their ids.
 */
export async function recoverInterruptedJobs(boss: PgBoss, queue = SENSOR_IMPORT_QUEUE, staleS = JOB_LEASE_S): Promise<string[]> {
  const ids = await requeueInterruptedJobs(staleS, (candidates) => activeJobIds(boss, queue, candidates));
  for (const id of ids) if (!(await handBack(boss, queue, id))) await giveUpInterruptedJob(id);
  return ids;
}

/**
 * Cancels a job: a queued one at once (and its pg-boss job), a running one between two batches
 * (the worker rolls the import back). Returns the job as it is now.
 * @throws DomainError conflict `finished` (job-store) for a job that has already ended
 */
export async function cancelSensorImport(em: EntityManager, job: ImportJobRow): Promise<ImportJobRow> {
  if ((await requestCancel(job)) === 'cancelled') await cancelQueued(job.id);
  await em.refresh(job);
  return job;
}

const g = globalThis as typeof globalThis & { __emberlineWorkers?: Map<string, Promise<string>> };

/** Starts this process's workers once (called from instrumentation.ts when the web server starts). */
export async function startJobWorkers(): Promise<void> {
  g.__emberlineWorkers ??= new Map();
  if (g.__emberlineWorkers.has(SENSOR_IMPORT_QUEUE)) return void (await g.__emberlineWorkers.get(SENSOR_IMPORT_QUEUE));
  const w = getBoss().then(async (boss) => {
    let sweeping: Promise<unknown> | null = null; // one sweep at a time, however slow the database is
    const recover = () => (sweeping ??= recoverInterruptedJobs(boss)
      .catch((e: unknown) => console.error('jobs: recovery failed:', e instanceof Error ? e.message : e))
      .finally(() => (sweeping = null)));
    await recover();
    setInterval(recover, JOB_RECOVERY_SWEEP_S * 1000).unref();
    return workSensorImports(boss);
  });
  g.__emberlineWorkers.set(SENSOR_IMPORT_QUEUE, w);
  w.catch(() => g.__emberlineWorkers?.delete(SENSOR_IMPORT_QUEUE));
  await w;
}
