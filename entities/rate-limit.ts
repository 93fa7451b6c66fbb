import { defineEntity, p } from '@mikro-orm/core';

/**
 * A fixed-window counter per key (e.g. "sign-in:ip:203.0.113.9"), kept in PostgreSQL so that the
 * limit holds across every web instance. Updated with one atomic upsert.
 */
export const RateLimit = defineEntity({
  name: 'RateLimit',
  tableName: 'rate_limit',
  properties: {
    key: p.string().length(300).primary(),
    count: p.integer(),
    resetAt: p.datetime().columnType('timestamptz'),
  },
});
