import { defineEntity, p } from '@mikro-orm/core';
import { baseProperties } from './base';
import { User } from './user';

/**
 * A signed-in browser. The session cookie is a jose-signed JWT naming this row; the server
 * revokes a session by setting `revokedAt`, and every session of a user by bumping
 * `User.tokenVersion`.
 */
export const Session = defineEntity({
  name: 'Session',
  tableName: 'session',
  // every request reads the session by id; sign-out-everywhere and the account page list a user's sessions
  indexes: [{ properties: ['user'] }],
  properties: {
    ...baseProperties(),
    user: () => p.manyToOne(User).deleteRule('cascade'),
    expiresAt: p.datetime().columnType('timestamptz'),
    revokedAt: p.datetime().columnType('timestamptz').nullable(),
    lastSeenAt: p.datetime().columnType('timestamptz'),
    userAgent: p.string().length(300).default(''),
  },
});
