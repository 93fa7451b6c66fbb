'use client';

import useSWR from 'swr';
import { fetcher } from './api';
import type { ImportJobDto } from '../_contracts/dto';

/** A background import as the API gives it (GET /api/jobs/{id}). */

export type { ImportJobDto };

export const jobActive = (j: Pick<ImportJobDto, 'state'>) => j.state === 'queued' || j.state === 'running';

/** The one SWR key of a job. */
export const jobKey = (id: string) => `/api/jobs/${id}`;
/** The one SWR key of a rig's latest jobs; shared with the server-rendered fallback. */
export const rigJobsKey = (rigId: string) => `/api/rigs/${rigId}/jobs`;

/** One job, polled every second while it is queued or running. */
export function useJob(id: string | null) {
  return useSWR<{ job: ImportJobDto }>(id ? jobKey(id) : null, fetcher, {
    refreshInterval: (d) => (d && !jobActive(d.job) ? 0 : 1000),
  });
}

/** A rig's latest jobs, polled every two seconds while one of them is active. */
export function useRigJobs(rigId: string, fallback?: { jobs: ImportJobDto[] }) {
  return useSWR<{ jobs: ImportJobDto[] }>(rigJobsKey(rigId), fetcher, {
    fallbackData: fallback,
    refreshInterval: (d) => (d && d.jobs.some(jobActive) ? 2000 : 0),
  });
}
