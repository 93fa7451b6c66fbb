import 'server-only';
import type { EntityManager } from '@mikro-orm/postgresql';
import { ImportJob, type ImportJobRow, type RigRow, type SourceFileRow, type UserRow } from '@/entities';
import type { ImportJobState } from '@/entities/import-job';
import { DomainError, conflict } from '../server/errors';
import { pgPool } from '../server/pg-pool';
import type { LogImportInput, SensorImportResult } from '../imports/sensor-import';

/**
 * The job store: the one module that writes `import_job` (entities/import-job.ts). A job row
 * lives beside its pg-boss job (same id) and goes
 *
 *   queued → running → completed | failed | cancelled      (queued → cancelled / failed, too)
 *
 * with its progress, result, error text, cancellation request and attempts. Every change of state
 * is one UPDATE here; those two processes can race on (a worker claiming a job a DELETE cancels,
 * two workers after a restart) are conditional, so only one wins. Writes go through the plain
 * pool, outside the import's own transaction, so the page sees progress while the import runs.
 *
 * Owns: the job's states and their transitions, progress, result, error texts, cancellation,
 * the lease and recovery of jobs whose process died. May import: entities, server/pg-pool,
 * server/errors, imports/sensor-import (types only). It knows nothing of pg-boss (jobs/queue.ts)
 * or HTTP: refusals are `DomainError`s (the route wrapper maps them), results plain values.
 */

const TERMINAL: readonly ImportJobState[] = ['completed', 'failed', 'cancelled'];

/**
 * The lease of a running job: its worker touches the row at least every `JOB_HEARTBEAT_S`
 * (`heartbeat`, besides every progress report), and a `running` job whose row has not been touched
 * for `JOB_LEASE_S` — and whose source file no live transaction holds — is taken for interrupted
 * (`requeueInterruptedJobs`). Every worker process looks for such jobs every `JOB_RECOVERY_SWEEP_S`,
 * so a job whose process was killed is handed back to the queue within lease + sweep (20 s) and
 * run again by another worker a few seconds later (the queue's retry delay and polling).
 */
export const JOB_HEARTBEAT_S = 5;
export const JOB_LEASE_S = 15;
export const JOB_RECOVERY_SWEEP_S = 5;
const sql = (text: string, values: unknown[]) => pgPool().query(text, values);

/**
 * Records an import job for a stored log (state `queued`); the caller enqueues it.
 * @throws DomainError invalid `not_a_log` (the upload is no data file); conflict `already_imported`,
 *   or `import_running` (with the open job's `jobId`) when the file has a queued or running job
 */
export async function createImportJob(em: EntityManager, rig: RigRow, file: SourceFileRow, user: UserRow | null, input: LogImportInput): Promise<ImportJobRow> {
  if (file.purpose !== 'trials') throw new DomainError('invalid', 'not_a_log', 'That upload is not a data file.');
  if (file.state === 'imported') throw conflict(`"${file.filename}" has already been imported into this lab (${file.rowsImported} rows).`, 'already_imported');
  const open = await em.findOne(ImportJob, { sourceFile: file, state: { $in: ['queued', 'running'] } });
  if (open) throw conflict(`"${file.filename}" is already being imported.`, 'import_running', { jobId: open.id });
  const job = em.create(ImportJob, { lab: rig.lab, rig, sourceFile: file, createdBy: user, input: input as unknown as Record<string, unknown>, bytesTotal: file.sizeBytes });
  await em.flush();
  return job;
}

/** A rig's latest import jobs, newest first, with their files (the rig page shows them with their progress). */
export async function listRigJobs(em: EntityManager, rig: RigRow, limit = 10): Promise<ImportJobRow[]> {
  return em.find(ImportJob, { rig }, { populate: ['sourceFile'], orderBy: { createdAt: 'desc' }, limit });
}

/**
 * Claims a job for a worker: `running`, one more attempt, progress from zero. Returns the job with
 * its source file and rig, or null when there is nothing to run: it has finished, it was cancelled
 * meanwhile, or its cancellation was asked for before it started (it ends `cancelled` here).
 */
export async function claimImportJob(em: EntityManager, id: string): Promise<ImportJobRow | null> {
  const job = await em.findOne(ImportJob, { id }, { populate: ['sourceFile', 'rig'] });
  if (!job || TERMINAL.includes(job.state)) return null;
  if (job.cancelRequested) {
    await endImportJob(job.id, 'cancelled');
    return null;
  }
  const claimed = await sql(
    `UPDATE import_job SET state = 'running', attempts = attempts + 1, started_at = now(), rows_done = 0, bytes_done = 0, error = NULL, updated_at = now()
     WHERE id = $1 AND state IN ('queued', 'running') AND NOT cancel_requested RETURNING id`,
    [job.id],
  );
  return claimed.rowCount ? job : null;
}

/** Records a running job's progress; returns true when its cancellation has been asked for. */
export async function recordProgress(id: string, p: { bytesDone: number; rowsDone: number }): Promise<boolean> {
  const r = await sql(`UPDATE import_job SET bytes_done = $2, rows_done = $3, updated_at = now() WHERE id = $1 RETURNING cancel_requested`, [id, p.bytesDone, p.rowsDone]);
  return r.rows[0]?.cancel_requested === true;
}

/** The worker's sign of life for a running job (renews its lease); a job that is no longer running is left alone. */
export async function heartbeat(id: string): Promise<void> {
  await sql(`UPDATE import_job SET updated_at = now() WHERE id = $1 AND state = 'running'`, [id]);
}

/** A job that has imported its file: `completed`, with the import's result. */
export async function completeImportJob(id: string, result: SensorImportResult): Promise<void> {
  await sql(`UPDATE import_job SET state = 'completed', result = $2, rows_done = $3, bytes_done = bytes_total, finished_at = now(), updated_at = now() WHERE id = $1`, [id, JSON.stringify(result), result.samples]);
}

/** Ends a job `failed` or `cancelled`, with the reason shown to the engineer (the earlier one is kept when none is given). */
export async function endImportJob(id: string, state: 'failed' | 'cancelled', error?: string): Promise<void> {
  await sql(`UPDATE import_job SET state = $2, error = COALESCE($3, error), finished_at = now(), updated_at = now() WHERE id = $1`, [id, state, error ?? null]);
}

/**
 * A job whose import failed on the server (not a refusal of the file): queued again for the
 * queue's retry, or `failed` when it was the last attempt. Nothing was imported either way.
 */
export async function retryImportJob(id: string, last: boolean): Promise<void> {
  if (last) return endImportJob(id, 'failed', 'The import failed on the server; nothing was imported.');
  await sql(`UPDATE import_job SET state = 'queued', error = $2, finished_at = NULL, updated_at = now() WHERE id = $1`, [id, 'The import failed on the server and will be retried; nothing was imported.']);
}

/**
 * Asks a job to stop: a queued one is cancelled at once, a running one stops between two batches
 * (the worker rolls the import back and ends it `cancelled`). Returns the job's state after.
 * @throws DomainError conflict `finished` for a job that has completed, failed or been cancelled
 */
export async function requestCancel(job: ImportJobRow): Promise<ImportJobState> {
  if (TERMINAL.includes(job.state)) {
    throw conflict(`The job has already ${job.state === 'completed' ? 'completed' : job.state === 'failed' ? 'failed' : 'been cancelled'}.`, 'finished');
  }
  const r = await pgPool().query<{ state: ImportJobState }>(
    `UPDATE import_job SET cancel_requested = true, state = CASE WHEN state = 'queued' THEN 'cancelled' ELSE state END,
       finished_at = CASE WHEN state = 'queued' THEN now() ELSE finished_at END, updated_at = now() WHERE id = $1 RETURNING state`,
    [job.id],
  );
  return r.rows[0]?.state ?? job.state;
}

/**
 * The lease: finds jobs that were running in a process that has gone (a restart of the web
 * server, a killed process) and sets them `queued` again. A live import holds a row lock on its
 * source file for its whole transaction and its worker renews the row every `JOB_HEARTBEAT_S`, so a
 * `running` job whose file row can be locked, and whose row has not been touched for `staleS`
 * (`JOB_LEASE_S` by default), has no process left. `leased(ids)` names those of them the queue still
 * holds as taken (the caller then hands them back to it). Returns their ids.
 */
export async function requeueInterruptedJobs(staleS: number = JOB_LEASE_S, leased: (ids: string[]) => Promise<string[]>): Promise<string[]> {
  const client = await pgPool().connect();
  try {
    await client.query('BEGIN');
    const r = await client.query<{ id: string }>(
      `SELECT j.id FROM import_job j JOIN source_file f ON f.id = j.source_file_id
        WHERE j.state = 'running' AND j.updated_at < now() - make_interval(secs => $1)
        FOR UPDATE OF f SKIP LOCKED`,
      [staleS],
    );
    const ids = r.rows.length ? await leased(r.rows.map((x) => x.id)) : [];
    if (ids.length) {
      await client.query(`UPDATE import_job SET state = 'queued', error = 'Interrupted by a restart of the server; started again.', updated_at = now() WHERE id = ANY($1::uuid[])`, [ids]);
    }
    await client.query('COMMIT');
    return ids;
  } catch (e) {
    await client.query('ROLLBACK').catch(() => undefined);
    throw e;
  } finally {
    client.release();
  }
}

/** A recovered job the queue will not run again (its retries are spent): `failed`. */
export async function giveUpInterruptedJob(id: string): Promise<void> {
  await endImportJob(id, 'failed', 'Interrupted by restarts too often; nothing was imported.');
}
