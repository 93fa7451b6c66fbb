'use client';

import useSWR from 'swr';
import { fetcher } from './api';
import type { StudyRecord } from '../_contracts/study-blocks';
import { studyKey } from '../_contracts/study-keys';

/**
 * The study (title, ordered blocks, revision) for lab members: the page's server render puts it in
 * the SWR fallback under `studyKey`, and the editor writes each saved version into the same cache
 * entry, so the blocks shown follow the editor without a server round trip. A null id fetches nothing.
 */
export function useStudy(studyId: string | null) {
  return useSWR<StudyRecord>(studyId ? studyKey(studyId) : null, fetcher, { revalidateIfStale: false, revalidateOnFocus: false });
}
