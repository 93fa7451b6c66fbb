import { defineEntity, p } from '@mikro-orm/core';
import { baseProperties } from './base';
import { Lab } from './lab';
import { ROLES, type Role } from './membership';
import { User } from './user';

/** An owner's invitation of an e-mail address to a lab with a role: single use, 7 days. */
export const Invitation = defineEntity({
  name: 'Invitation',
  tableName: 'invitation',
  properties: {
    ...baseProperties(),
    lab: () => p.manyToOne(Lab).deleteRule('cascade'),
    email: p.string().length(254),
    role: p.enum(() => [...ROLES]).$type<Role>(),
    /** SHA-256 of the token sent by e-mail; the token itself is never stored. */
    tokenHash: p.string().length(64).unique().hidden(),
    expiresAt: p.datetime().columnType('timestamptz'),
    acceptedAt: p.datetime().columnType('timestamptz').nullable(),
    revokedAt: p.datetime().columnType('timestamptz').nullable(),
    invitedBy: () => p.manyToOne(User).nullable().deleteRule('set null'),
  },
});
