'use client';

import useSWR from 'swr';
import { fetcher } from './api';
import type { TrialPageDto } from '../_contracts/dto';

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
  return useSWR<TrialPageDto>(trialsKey(rigId, q), fetcher, { keepPreviousData: true });
}
