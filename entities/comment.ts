import { defineEntity, p } from '@mikro-orm/core';
import { baseProperties } from './base';
import { Lab } from './lab';
import { User } from './user';

/** A reviewer's (or author's) comment on a fit, a design comparison or one block of a study. */
export const Comment = defineEntity({
  name: 'Comment',
  tableName: 'comment',
  indexes: [{ properties: ['targetKind', 'targetId', 'createdAt'] }],
  properties: {
    ...baseProperties(),
    lab: () => p.manyToOne(Lab).deleteRule('cascade'),
    author: () => p.manyToOne(User).nullable().deleteRule('set null'),
    targetKind: p.enum(() => ['fit', 'study', 'comparison'] as const).$type<'fit' | 'study' | 'comparison'>(),
    targetId: p.uuid(),
    blockId: p.string().length(40).nullable(),
    body: p.text(),
  },
});
