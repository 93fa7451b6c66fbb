import { defineEntity, p } from '@mikro-orm/core';
import { baseProperties } from './base';
import { Lab } from './lab';
import { Study } from './study';
import { User } from './user';

/** A read-only link to a study for people without an account: stored as a hash, with an expiry, revocable. */
export const ShareLink = defineEntity({
  name: 'ShareLink',
  tableName: 'share_link',
  // a study's page lists its links
  indexes: [{ properties: ['study', 'createdAt'] }],
  properties: {
    ...baseProperties(),
    lab: () => p.manyToOne(Lab).deleteRule('cascade'),
    study: () => p.manyToOne(Study).deleteRule('cascade'),
    createdBy: () => p.manyToOne(User).nullable().deleteRule('set null'),
    tokenHash: p.string().length(64).unique().hidden(),
    expiresAt: p.datetime().columnType('timestamptz'),
    revokedAt: p.datetime().columnType('timestamptz').nullable(),
  },
});
