'use client';

import Link from 'next/link';
import { useEffect, useRef, useState } from 'react';
import { useSWRConfig } from 'swr';
import { api, ApiError } from './api';
import { jobActive, useJob, useRigJobs, type ImportJobDto } from './use-jobs';

const STATE_TEXT: Record<ImportJobDto['state'], string> = {
  queued: 'Waiting for a worker',
  running: 'Importing',
  completed: 'Imported',
  failed: 'Failed',
  cancelled: 'Cancelled',
};

const mb = (b: number) => `${(b / 1024 / 1024).toFixed(1)} MB`;

/** Progress bar, counts and the cancel button of one job. */
function JobView({ job, canCancel, onChanged }: { job: ImportJobDto; canCancel: boolean; onChanged: () => void }) {
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const pct = Math.round(job.progress.fraction * 100);
  const active = jobActive(job);
  async function cancel() {
    setBusy(true);
    setError(null);
    try {
      await api(`/api/jobs/${job.id}`, { method: 'DELETE' });
      onChanged();
    } catch (e) {
      setError(e instanceof ApiError ? e.message : 'The server could not be reached.');
    } finally {
      setBusy(false);
    }
  }
  const tone = job.state === 'completed' ? 'text-ok-text' : job.state === 'failed' ? 'text-danger-text' : job.state === 'cancelled' ? 'text-caution-text' : 'text-ink';
  return (
    <div className="space-y-2" data-job-state={job.state}>
      <p className="flex flex-wrap items-baseline gap-x-3 text-sm">
        <span className={`font-semibold ${tone}`}>{job.cancelRequested && active ? 'Cancelling…' : STATE_TEXT[job.state]}</span>
        {job.filename ? <span className="text-ink-soft">{job.filename}</span> : null}
        {active ? (
          <span className="num text-ink-muted">
            {mb(job.progress.bytesDone)} of {mb(job.progress.bytesTotal)} read, {job.progress.rowsDone.toLocaleString('en')} samples
          </span>
        ) : null}
        {job.attempts > 1 && active ? <span className="text-ink-muted">attempt {job.attempts} (started again after a restart)</span> : null}
      </p>
      {active ? (
        <div role="progressbar" aria-label={`Import of ${job.filename ?? 'the log'}`} aria-valuenow={pct} aria-valuemin={0} aria-valuemax={100} className="h-3 overflow-hidden rounded-full bg-paper-deep">
          <div className="h-full bg-ember-500 transition-all" style={{ width: `${pct}%` }} />
        </div>
      ) : null}
      {job.state === 'completed' && job.result ? (
        <p className="text-sm" role="status">
          <span className="num">{(job.result.samples ?? 0).toLocaleString('en')}</span> samples stored,{' '}
          <span className="num">{job.result.trials ?? 0}</span> steady trial{job.result.trials === 1 ? '' : 's'} made
          {job.result.excludedRows || job.result.skippedRows ? (
            <>
              , <span className="num">{((job.result.excludedRows ?? 0) + (job.result.skippedRows ?? 0)).toLocaleString('en')}</span> row
              {(job.result.excludedRows ?? 0) + (job.result.skippedRows ?? 0) === 1 ? '' : 's'} left out
            </>
          ) : null}
          .
        </p>
      ) : null}
      {job.error && !active ? <p className={`text-sm ${job.state === 'failed' ? 'text-danger-text' : 'text-ink-muted'}`}>{job.error}</p> : null}
      {job.error && active ? <p className="text-sm text-ink-muted">{job.error}</p> : null}
      {active && canCancel && !job.cancelRequested ? (
        <button type="button" className="btn-quiet" disabled={busy} onClick={cancel}>
          Cancel the import
        </button>
      ) : null}
      {error ? <p role="alert" className="text-sm text-danger-text">{error}</p> : null}
    </div>
  );
}

/** One job followed until it ends (the import page after "Import"). */
export function JobProgress({ jobId, rigId }: { jobId: string; rigId: string }) {
  const { data, error, mutate } = useJob(jobId);
  if (error) return <p role="alert" className="text-sm text-danger-text">{error instanceof ApiError ? error.message : 'The job could not be read.'}</p>;
  if (!data) return <p className="text-sm text-ink-muted">Starting the import…</p>;
  return (
    <div className="space-y-3">
      <JobView job={data.job} canCancel onChanged={() => void mutate()} />
      {!jobActive(data.job) ? (
        <p className="flex flex-wrap gap-3">
          <Link className="btn-primary" href={`/rigs/${rigId}`}>
            See the trials
          </Link>
        </p>
      ) : (
        <p className="text-xs text-ink-muted">The import runs on the server: you may leave this page; the rig page shows its progress.</p>
      )}
    </div>
  );
}

/** The rig page's list of its latest background imports (hidden when there are none). */
export function RigJobs({ rigId, initial, canCancel }: { rigId: string; initial: ImportJobDto[]; canCancel: boolean }) {
  const { data, mutate } = useRigJobs(rigId, { jobs: initial });
  const jobs = data?.jobs ?? initial;
  const { mutate: mutateAll } = useSWRConfig();
  const active = useRef(new Set(initial.filter(jobActive).map((j) => j.id)));
  // when an import finishes, the trials table below shows its trials
  useEffect(() => {
    const now = new Set(jobs.filter(jobActive).map((j) => j.id));
    const ended = [...active.current].some((id) => !now.has(id));
    active.current = now;
    if (ended) void mutateAll((key) => typeof key === 'string' && key.startsWith(`/api/rigs/${rigId}/trials`));
  }, [jobs, mutateAll, rigId]);
  if (!jobs.length) return null;
  return (
    <section className="card mb-6 space-y-4 p-5" aria-labelledby="jobs-h">
      <h2 id="jobs-h" className="text-lg">
        Sensor-log imports
      </h2>
      <ul className="space-y-4">
        {jobs.map((j) => (
          <li key={j.id} className="border-b border-paper-line pb-3 last:border-0 last:pb-0">
            <JobView job={j} canCancel={canCancel} onChanged={() => void mutate()} />
            <p className="num mt-1 text-xs text-ink-muted">started {j.createdAt.slice(0, 16).replace('T', ' ')} UTC</p>
          </li>
        ))}
      </ul>
    </section>
  );
}
