import { defineEntity, p } from '@mikro-orm/core';
import { baseProperties } from './base';
import { Trial } from './trial';
import { User } from './user';

/** One edit of a trial (notes, exclusion): who changed what, from what, to what. */
export const TrialChange = defineEntity({
  name: 'TrialChange',
  tableName: 'trial_change',
  indexes: [{ properties: ['trial', 'createdAt'] }],
  properties: {
    ...baseProperties(),
    trial: () => p.manyToOne(Trial).deleteRule('cascade'),
    user: () => p.manyToOne(User).nullable().deleteRule('set null'),
    field: p.string().length(40),
    before: p.json<unknown>().nullable(),
    after: p.json<unknown>().nullable(),
  },
});
