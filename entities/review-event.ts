import { defineEntity, p } from '@mikro-orm/core';
import { baseProperties } from './base';
import { Lab } from './lab';
import { REVIEW_STATES, type ReviewState } from './review';
import { User } from './user';

/** One step of a review history: who moved a fit or study from which state to which, and why. */
export const ReviewEvent = defineEntity({
  name: 'ReviewEvent',
  tableName: 'review_event',
  indexes: [{ properties: ['targetKind', 'targetId', 'createdAt'] }],
  properties: {
    ...baseProperties(),
    lab: () => p.manyToOne(Lab).deleteRule('cascade'),
    actor: () => p.manyToOne(User).nullable().deleteRule('set null'),
    targetKind: p.enum(() => ['fit', 'study'] as const).$type<'fit' | 'study'>(),
    targetId: p.uuid(),
    fromState: p.enum(() => [...REVIEW_STATES]).$type<ReviewState>(),
    toState: p.enum(() => [...REVIEW_STATES]).$type<ReviewState>(),
    note: p.text().default(''),
  },
});
