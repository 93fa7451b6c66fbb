import { defineEntity, p } from '@mikro-orm/core';
import { baseProperties } from './base';
import { User } from './user';

/** A password-reset token: stored as its SHA-256, single use, valid one hour. */
export const PasswordReset = defineEntity({
  name: 'PasswordReset',
  tableName: 'password_reset',
  properties: {
    ...baseProperties(),
    user: () => p.manyToOne(User).deleteRule('cascade'),
    tokenHash: p.string().length(64).unique().hidden(),
    expiresAt: p.datetime().columnType('timestamptz'),
    usedAt: p.datetime().columnType('timestamptz').nullable(),
  },
});
