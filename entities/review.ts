/** The review states of fits and studies. */
export const REVIEW_STATES = ['draft', 'in-review', 'approved', 'changes-requested'] as const;
export type ReviewState = (typeof REVIEW_STATES)[number];
