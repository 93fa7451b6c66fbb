import { defineEntity, p } from '@mikro-orm/core';
import { baseProperties } from './base';
import { Lab } from './lab';
import { User } from './user';

/** An in-app notice for one user (e.g. "your study was approved"), with a link to the thing. */
export const Notice = defineEntity({
  name: 'Notice',
  tableName: 'notice',
  indexes: [{ properties: ['user', 'readAt'] }],
  properties: {
    ...baseProperties(),
    user: () => p.manyToOne(User).deleteRule('cascade'),
    lab: () => p.manyToOne(Lab).deleteRule('cascade'),
    text: p.string().length(300),
    link: p.string().length(300),
    readAt: p.datetime().columnType('timestamptz').nullable(),
  },
});
