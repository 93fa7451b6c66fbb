import { defineEntity, p } from '@mikro-orm/core';
import { baseProperties } from './base';
import { Lab } from './lab';
import { User } from './user';

/**
 * A personal API token for scripts and data loggers, acting in one lab with its owner's role
 * there, until it expires. Shown once; stored as its SHA-256 with a short visible prefix to tell tokens apart.
 */
export const ApiToken = defineEntity({
  name: 'ApiToken',
  tableName: 'api_token',
  properties: {
    ...baseProperties(),
    user: () => p.manyToOne(User).deleteRule('cascade'),
    lab: () => p.manyToOne(Lab).deleteRule('cascade'),
    name: p.string().length(80),
    prefix: p.string().length(16),
    tokenHash: p.string().length(64).unique().hidden(),
    lastUsedAt: p.datetime().columnType('timestamptz').nullable(),
    /** the token stops working at this time (chosen at creation, 90 days by default) */
    expiresAt: p.datetime().columnType('timestamptz'),
    revokedAt: p.datetime().columnType('timestamptz').nullable(),
  },
});
