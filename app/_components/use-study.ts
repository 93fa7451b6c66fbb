'use client';

import useSWR from 'swr';
import { fetcher } from './api';
import { studyKey, type StudyRecord } from './study-block-types';

/**
 * The study (title, ordered blocks, revision) for lab members: the page's server render puts it in
 * the SWR fallback under `studyKey`, and the editor writes each saved version into the same cache
 * entry, so the blocks shown follow the editor without a server round trip. A null id fetches nothing.
 */
export function useStudy(studyId: string | null) {
  return useSWR<StudyRecord>(studyId ? studyKey(studyId) : null, fetcher, { revalidateIfStale: false, revalidateOnFocus: false });
}
