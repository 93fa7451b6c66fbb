'use client';

import useSWR from 'swr';
import { fetcher } from './api';

export interface TrialRowDto {
  id: string;
  startedAt: string;
  bucketVolumeM3: number | null;
  fillTimesS: number[] | null;
  flowM3PerS: number;
  inletTempC: number;
  outletTempC: number;
  ambientTempC: number | null;
  isReference: boolean;
  excluded: boolean;
  notes: string;
  origin: string;
  sourceLine: number | null;
  warnings: string[];
}

/** One page of a rig's trials, with the hottest inlet and outlet (°C) of all trials matching the query. */
export interface TrialPage {
  trials: TrialRowDto[];
  total: number;
  page: number;
  pageSize: number;
  hottest?: { inletTempC: number | null; outletTempC: number | null };
}

export interface TrialQuery {
  page: number;
  pageSize: number;
  sort: 'startedAt' | 'flowM3PerS' | 'inletTempC' | 'outletTempC' | 'createdAt';
  dir: 'asc' | 'desc';
  excluded: 'all' | 'included' | 'excluded';
  reference: 'all' | 'only';
  q: string;
}

export const DEFAULT_TRIAL_QUERY: TrialQuery = { page: 1, pageSize: 25, sort: 'startedAt', dir: 'asc', excluded: 'all', reference: 'all', q: '' };

/** The one SWR key of a rig's trial page; shared with the server-rendered fallback. */
export function trialsKey(rigId: string, q: TrialQuery): string {
  const p = new URLSearchParams(Object.entries(q).map(([k, v]) => [k, String(v)]));
  return `/api/rigs/${rigId}/trials?${p}`;
}

export function useTrials(rigId: string, q: TrialQuery) {
  return useSWR<TrialPage>(trialsKey(rigId, q), fetcher, { keepPreviousData: true });
}
