/**
 * The SWR keys of a study and its blocks, defined once: the server pages put each block under its
 * key in the SWR `fallback` (app/studies/[studyId]/page.tsx, app/share/[token]/page.tsx) and the
 * client hooks read the same keys (app/_components/use-study.ts, use-study-block.ts); the editor
 * revalidates a block by its key after a save. No directive, so both sides import it.
 */
import type { UnitSystem } from '@/analysis/units/unit-system';

/** SWR key of a study (lab members). */
export const studyKey = (studyId: string) => `/api/studies/${studyId}`;
/** SWR key of one block of a study, for lab members (in the member's own units). */
export const studyBlockKey = (studyId: string, blockId: string) => `/api/studies/${studyId}/blocks/${encodeURIComponent(blockId)}`;
/** SWR key of one block on the public share view, in the units the reader chose. */
export const sharedBlockKey = (token: string, blockId: string, units: UnitSystem) =>
  `/api/share/${encodeURIComponent(token)}/blocks/${encodeURIComponent(blockId)}?units=${units}`;
