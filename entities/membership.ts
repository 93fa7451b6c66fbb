import { defineEntity, p } from '@mikro-orm/core';
import { baseProperties } from './base';
import { Lab } from './lab';
import { User } from './user';

export const ROLES = ['owner', 'engineer', 'reviewer', 'viewer'] as const;
export type Role = (typeof ROLES)[number];

/** A user's role in one lab. A user may belong to several labs. */
export const Membership = defineEntity({
  name: 'Membership',
  tableName: 'membership',
  uniques: [{ properties: ['user', 'lab'] }],
  properties: {
    ...baseProperties(),
    user: () => p.manyToOne(User).deleteRule('cascade'),
    lab: () => p.manyToOne(Lab).deleteRule('cascade'),
    role: p.enum(() => [...ROLES]).$type<Role>(),
  },
});
