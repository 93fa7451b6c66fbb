import { defineEntity, p } from '@mikro-orm/core';
import { baseProperties } from './base';
import { Lab } from './lab';
import { User } from './user';

export const AUDIT_KINDS = [
  'sign-in', 'sign-in-failed', 'sign-out', 'sign-out-everywhere', 'sign-up', 'password-changed', 'password-reset-requested',
  'password-reset', 'invitation-sent', 'invitation-accepted', 'role-changed', 'member-removed', 'lab-created',
  'token-created', 'token-revoked', 'tokens-revoked', 'sign-up-requested', 'invitation-replaced', 'share-created', 'share-revoked',
  'review-submitted', 'review-approved', 'review-returned', 'file-downloaded', 'request-refused', 'rate-limited',
] as const;
export type AuditKind = (typeof AUDIT_KINDS)[number];

/** One security event. `lab` is set for events of a lab (readable by its owners). */
export const AuditEvent = defineEntity({
  name: 'AuditEvent',
  tableName: 'audit_event',
  indexes: [{ properties: ['lab', 'createdAt'] }],
  properties: {
    ...baseProperties(),
    lab: () => p.manyToOne(Lab).nullable().deleteRule('cascade'),
    actor: () => p.manyToOne(User).nullable().deleteRule('set null'),
    kind: p.enum(() => [...AUDIT_KINDS]).$type<AuditKind>(),
    /** What the event was about, in words (an e-mail address, a token name, "engineer → reviewer"). */
    subject: p.string().length(300).default(''),
    ip: p.string().length(64).default(''),
  },
});
