import { defineEntity, p } from '@mikro-orm/core';
import { baseProperties } from './base';

/**
 * A sign-up waiting for its address to be confirmed. Sign-up answers the same way whether or not
 * the address has an account, so the account is made only when the link mailed to the address is
 * followed: single use, 24 hours. The password is kept as its argon2id hash, the token as its
 * SHA-256.
 */
export const PendingSignUp = defineEntity({
  name: 'PendingSignUp',
  tableName: 'pending_sign_up',
  indexes: [{ properties: ['email'] }],
  properties: {
    ...baseProperties(),
    email: p.string().length(254),
    name: p.string().length(120),
    labName: p.string().length(120).default(''),
    passwordHash: p.string().length(255).hidden(),
    tokenHash: p.string().length(64).unique().hidden(),
    /** a same-origin path to go to after the account is made (an invitation, say) */
    next: p.string().length(500).default(''),
    expiresAt: p.datetime().columnType('timestamptz'),
    usedAt: p.datetime().columnType('timestamptz').nullable(),
  },
});
