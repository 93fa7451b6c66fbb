import 'server-only';
import { wrap } from '@mikro-orm/core';
import type { EntityManager } from '@mikro-orm/postgresql';
import PgBoss from 'pg-boss';
import { ImportJob, type ImportJobRow, type RigRow, type SourceFileRow, type UserRow } from '@/entities';
import { getEm } from '../server/db';
import { DomainError } from '../server/errors';
import { ImportError } from '../imports';
import type { RouteContext } from '../server/route';
import { AlreadyImported, ImportCancelled, copyPool, importSensorLog, type LogImportInput } from '../imports/sensor-import';
import type { Action } from '../labs/permissions';

/**
 * Background jobs on PostgreSQL through pg-boss. One PgBoss instance per process (its start
 * promise cached on globalThis, like the ORM); the web server starts the worker from
 * instrumentation.ts. Jobs live in the database, so a job sent before a restart is picked up by
 * the next process; a job that was running when its process died is found by the next worker
 * (recoverInterruptedJobs) and run again — or, at the latest, retried when pg-boss sees it expire.
 * The import is one transaction, so a half-done attempt left nothing to clean up.
 */

export const SENSOR_IMPORT_QUEUE = 'sensor-import';
/** A running import that takes longer than this is taken for dead and retried. */
const EXPIRE_S = 15 * 60;
const RETRY_LIMIT = 2;

interface SensorImportData {
  importJobId: string;
}

const g = globalThis as typeof globalThis & { __emberlineBoss?: Promise<PgBoss>; __emberlineWorkers?: Map<string, Promise<string>> };

/** A new, unstarted PgBoss on DATABASE_URL (schema `pgboss`). Most code wants getBoss(). */
export function newBoss(): PgBoss {
  const boss = new PgBoss({
    connectionString: process.env.DATABASE_URL ?? 'postgres://emberline@127.0.0.1:54329/emberline',
    schema: 'pgboss',
    max: 3,
    application_name: 'emberline-jobs',
  });
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

/** Registers the sensor-import worker on a started PgBoss; returns the worker id. */
export function workSensorImports(boss: PgBoss, queue = SENSOR_IMPORT_QUEUE): Promise<string> {
  return boss.work<SensorImportData>(queue, { batchSize: 1, pollingIntervalSeconds: 1, includeMetadata: true }, async ([job]) => {
    await runSensorImportJob(job.data.importJobId, { retryCount: job.retryCount, retryLimit: job.retryLimit });
  });
}

/**
 * Finds imports that were running in a process that has gone (a restart of the web server) and
 * hands them back to pg-boss at once, instead of waiting for their expiry. A live import holds a
 * row lock on its source file for its whole transaction, so a `running` job whose file row can be
 * locked, and whose progress has not moved for `staleS`, has no process left. Returns their ids.
 */
export async function recoverInterruptedJobs(boss: PgBoss, queue = SENSOR_IMPORT_QUEUE, staleS = 60): Promise<string[]> {
  const client = await copyPool().connect();
  let ids: string[] = [];
  try {
    await client.query('BEGIN');
    const r = await client.query<{ id: string }>(
      `SELECT j.id FROM import_job j JOIN source_file f ON f.id = j.source_file_id
        WHERE j.state = 'running' AND j.updated_at < now() - make_interval(secs => $1)
          AND EXISTS (SELECT 1 FROM pgboss.job b WHERE b.name = $2 AND b.id = j.id AND b.state = 'active')
        FOR UPDATE OF f SKIP LOCKED`,
      [staleS, queue],
    );
    ids = r.rows.map((x) => x.id);
    if (ids.length) {
      await client.query(`UPDATE import_job SET state = 'queued', error = 'Interrupted by a restart of the server; started again.', updated_at = now() WHERE id = ANY($1::uuid[])`, [ids]);
    }
    await client.query('COMMIT');
  } catch (e) {
    await client.query('ROLLBACK').catch(() => undefined);
    throw e;
  } finally {
    client.release();
  }
  for (const id of ids) {
    await boss.fail(queue, id, { message: 'interrupted by a restart' });
    const j = await boss.getJobById(queue, id);
    if (j && j.state === 'failed') {
      await copyPool().query(`UPDATE import_job SET state = 'failed', error = 'Interrupted by restarts too often; nothing was imported.', finished_at = now(), updated_at = now() WHERE id = $1`, [id]);
    }
  }
  return ids;
}

/** Starts this process's workers once (called from instrumentation.ts when the web server starts). */
export async function startJobWorkers(): Promise<void> {
  g.__emberlineWorkers ??= new Map();
  if (g.__emberlineWorkers.has(SENSOR_IMPORT_QUEUE)) return void (await g.__emberlineWorkers.get(SENSOR_IMPORT_QUEUE));
  const w = getBoss().then(async (boss) => {
    const recover = () => recoverInterruptedJobs(boss).catch((e: unknown) => console.error('jobs: recovery failed:', e instanceof Error ? e.message : e));
    await recover();
    setInterval(recover, 60_000).unref();
    return workSensorImports(boss);
  });
  g.__emberlineWorkers.set(SENSOR_IMPORT_QUEUE, w);
  w.catch(() => g.__emberlineWorkers?.delete(SENSOR_IMPORT_QUEUE));
  await w;
}

/** Records an import job for a stored log (state `queued`); the caller enqueues it. */
export async function createImportJobRow(em: EntityManager, rig: RigRow, file: SourceFileRow, user: UserRow | null, input: LogImportInput): Promise<ImportJobRow> {
  if (file.purpose !== 'trials') throw new DomainError('invalid', 'not_a_log', 'That upload is not a data file.');
  if (file.state === 'imported') throw new DomainError('conflict', 'already_imported', `"${file.filename}" has already been imported into this lab (${file.rowsImported} rows).`);
  const open = await em.findOne(ImportJob, { sourceFile: file, state: { $in: ['queued', 'running'] } });
  if (open) throw new DomainError('conflict', 'import_running', `"${file.filename}" is already being imported.`, { jobId: open.id });
  const job = em.create(ImportJob, { lab: rig.lab, rig, sourceFile: file, createdBy: user, input: input as unknown as Record<string, unknown>, bytesTotal: file.sizeBytes });
  await em.flush();
  return job;
}

/** POST …/log-import: the job row, then the pg-boss job. */
export async function startSensorImport(em: EntityManager, rig: RigRow, file: SourceFileRow, user: UserRow, input: LogImportInput): Promise<ImportJobRow> {
  const job = await createImportJobRow(em, rig, file, user, input);
  try {
    await enqueueSensorImport(await getBoss(), job.id);
  } catch (e) {
    job.state = 'failed';
    job.error = 'The job queue is not available; try again.';
    await em.flush();
    throw e;
  }
  return job;
}

const sql = (text: string, values: unknown[]) => copyPool().query(text, values);

/**
 * Runs one import job: marks it running, imports (one transaction), and records the outcome.
 * Refusals of the file (a bad row, a bad mapping) and cancellation end the job; other errors are
 * rethrown so that pg-boss retries, while the row says so.
 */
export async function runSensorImportJob(importJobId: string, retry: { retryCount: number; retryLimit: number } = { retryCount: 0, retryLimit: 0 }): Promise<void> {
  const em = await getEm();
  const job = await em.findOne(ImportJob, { id: importJobId }, { populate: ['sourceFile', 'rig'] });
  if (!job || job.state === 'completed' || job.state === 'cancelled' || job.state === 'failed') return;
  if (job.cancelRequested) {
    await sql(`UPDATE import_job SET state = 'cancelled', finished_at = now(), updated_at = now() WHERE id = $1`, [job.id]);
    return;
  }
  const claimed = await sql(
    `UPDATE import_job SET state = 'running', attempts = attempts + 1, started_at = now(), rows_done = 0, bytes_done = 0, error = NULL, updated_at = now()
     WHERE id = $1 AND state IN ('queued', 'running') AND NOT cancel_requested RETURNING id`,
    [job.id],
  );
  if (!claimed.rowCount) return; // cancelled meanwhile
  const file = job.sourceFile;
  try {
    const result = await importSensorLog(
      { fileId: file.id, rigId: job.rig.id, labId: job.lab.id, filename: file.filename, storageKey: file.storageKey, sizeBytes: file.sizeBytes, uploadedAt: file.createdAt },
      job.input as unknown as LogImportInput,
      {
        onProgress: async (p) => {
          const r = await sql(`UPDATE import_job SET bytes_done = $2, rows_done = $3, updated_at = now() WHERE id = $1 RETURNING cancel_requested`, [job.id, p.bytesDone, p.rowsDone]);
          return r.rows[0]?.cancel_requested === true;
        },
      },
    );
    await sql(`UPDATE import_job SET state = 'completed', result = $2, rows_done = $3, bytes_done = bytes_total, finished_at = now(), updated_at = now() WHERE id = $1`, [job.id, JSON.stringify(result), result.samples]);
  } catch (e) {
    if (e instanceof ImportCancelled) {
      await sql(`UPDATE import_job SET state = 'cancelled', error = $2, finished_at = now(), updated_at = now() WHERE id = $1`, [job.id, e.message]);
      return;
    }
    if (e instanceof ImportError || e instanceof AlreadyImported) {
      await sql(`UPDATE import_job SET state = 'failed', error = $2, finished_at = now(), updated_at = now() WHERE id = $1`, [job.id, e.message]);
      return;
    }
    const last = retry.retryCount >= retry.retryLimit;
    console.error(`sensor import ${job.id} failed${last ? '' : ' (will retry)'}:`, e);
    await sql(`UPDATE import_job SET state = $2, error = $3, finished_at = CASE WHEN $2 = 'failed' THEN now() END, updated_at = now() WHERE id = $1`, [
      job.id, last ? 'failed' : 'queued', last ? 'The import failed on the server; nothing was imported.' : 'The import failed on the server and will be retried; nothing was imported.',
    ]);
    throw e;
  }
}

export const importJobDto = (j: ImportJobRow) => ({
  id: j.id,
  kind: 'sensor-import' as const,
  state: j.state,
  rigId: j.rig.id,
  fileId: j.sourceFile.id,
  filename: wrap(j.sourceFile).isInitialized() ? j.sourceFile.filename : null,
  progress: { bytesDone: j.bytesDone, bytesTotal: j.bytesTotal, rowsDone: j.rowsDone, fraction: j.bytesTotal > 0 ? Math.min(1, j.bytesDone / j.bytesTotal) : 0 },
  attempts: j.attempts,
  cancelRequested: j.cancelRequested,
  result: j.result ?? null,
  error: j.error ?? null,
  createdAt: j.createdAt.toISOString(),
  startedAt: j.startedAt?.toISOString() ?? null,
  finishedAt: j.finishedAt?.toISOString() ?? null,
});

/**
 * Cancels a job: a queued one at once, a running one between two batches (the worker rolls the
 * import back). A finished job cannot be cancelled (409).
 */
export async function cancelJob(em: EntityManager, job: ImportJobRow): Promise<ImportJobRow> {
  if (job.state === 'completed' || job.state === 'failed' || job.state === 'cancelled') {
    throw new DomainError('conflict', 'finished', `The job has already ${job.state === 'completed' ? 'completed' : job.state === 'failed' ? 'failed' : 'been cancelled'}.`);
  }
  const r = await copyPool().query<{ state: ImportJobRow['state'] }>(
    `UPDATE import_job SET cancel_requested = true, state = CASE WHEN state = 'queued' THEN 'cancelled' ELSE state END,
       finished_at = CASE WHEN state = 'queued' THEN now() ELSE finished_at END, updated_at = now() WHERE id = $1 RETURNING state`,
    [job.id],
  );
  if (r.rows[0]?.state === 'cancelled') {
    try {
      await (await getBoss()).cancel(SENSOR_IMPORT_QUEUE, job.id);
    } catch {
      /* the worker sees the cancelled row and skips it */
    }
  }
  await em.refresh(job);
  return job;
}

/** A rig's latest import jobs, newest first (the rig page shows them with their progress). */
export async function listRigJobs(em: EntityManager, rig: RigRow, limit = 10): Promise<ImportJobRow[]> {
  return em.find(ImportJob, { rig }, { populate: ['sourceFile'], orderBy: { createdAt: 'desc' }, limit });
}
