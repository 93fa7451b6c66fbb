'use client';

import useSWR from 'swr';
import { fetcher } from './api';
import type { BlockData } from '../_contracts/study-blocks';

/**
 * One study block's data (numbers, tables, plot SVG) from its block-data route. `key` is
 * studyBlockKey (members) or sharedBlockKey (share view), the same key the server page used for
 * the fallback, so the first paint needs no fetch. Blocks are computed on the server and change
 * only when their settings do: no refetch on focus or mount; the editor revalidates the blocks it
 * changed (`mutate(key)`), and a block with no fallback (just added) is fetched once.
 */
export function useStudyBlock(key: string) {
  return useSWR<{ block: BlockData }>(key, fetcher, { revalidateIfStale: false, revalidateOnFocus: false, revalidateOnReconnect: false, keepPreviousData: true });
}
