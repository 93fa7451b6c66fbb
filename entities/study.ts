import { defineEntity, p } from '@mikro-orm/core';
import { baseProperties } from './base';
import { Lab } from './lab';
import { REVIEW_STATES, type ReviewState } from './review';
import { User } from './user';

export const BLOCK_KINDS = [
  'text', 'trials', 'fit', 'comparison', 'performance', 'forecast', 'costs', 'sensor-log', 'caution', 'design-comparison',
  // solar collectors
  'collector',
  // operating plans of a rig, read when the study is (mutable: never in the block cache)
  'operating-plan',
  'tub-fill',
] as const;
export type BlockKind = (typeof BLOCK_KINDS)[number];

/** One block of a study; `id` is stable across edits so comments can point at it. */
export interface StudyBlock {
  id: string;
  kind: BlockKind;
  /** Block settings: the Markdown of a text block, the fit id of a fit block, a forecast's inputs… */
  data: Record<string, unknown>;
}

/**
 * A notebook-style page of ordered blocks. `revision` rises with every save: an editor saves
 * against the revision they loaded, and a mismatch is a conflict, never a silent overwrite.
 */
export const Study = defineEntity({
  name: 'Study',
  tableName: 'study',
  indexes: [{ properties: ['lab', 'updatedAt'] }],
  properties: {
    ...baseProperties(),
    lab: () => p.manyToOne(Lab).deleteRule('cascade'),
    createdBy: () => p.manyToOne(User).nullable().deleteRule('set null'),
    updatedBy: () => p.manyToOne(User).nullable().deleteRule('set null'),
    title: p.string().length(160),
    blocks: p.json<StudyBlock[]>(),
    revision: p.integer().default(1),
    reviewState: p.enum(() => [...REVIEW_STATES]).default('draft').$type<ReviewState>(),
    /** ids of the people who saved the study since its last review decision: none of them may decide its review */
    editedSinceReview: p.json<string[]>().default([]),
  },
});
