import 'server-only';
/**
 * Plain data that crosses to the browser. Entities never do: each DTO lists its fields, so a
 * hidden column (a hash, a secret) cannot slip out.
 */
import type { ApiTokenRow, AuditEventRow, InvitationRow, LabRow, MembershipRow, RigRow, UserRow } from '@/entities';
import type { LabDto, RigDto, TokenDto, UserDto } from '@/app/_contracts/dto';

export const userDto = (u: UserRow): UserDto => ({ id: u.id, email: u.email, name: u.name, unitSystem: u.unitSystem });

export const labDto = (l: LabRow): LabDto => ({ id: l.id, name: l.name, slug: l.slug, unitSystem: l.unitSystem, isDemo: l.isDemo });

export const memberDto = (m: MembershipRow) => ({
  id: m.id,
  role: m.role,
  user: { id: m.user.id, email: m.user.email, name: m.user.name },
  since: m.createdAt.toISOString(),
});

export const invitationDto = (i: InvitationRow) => ({
  id: i.id,
  email: i.email,
  role: i.role,
  expiresAt: i.expiresAt.toISOString(),
  acceptedAt: i.acceptedAt?.toISOString() ?? null,
  revokedAt: i.revokedAt?.toISOString() ?? null,
});

export const tokenDto = (t: ApiTokenRow): TokenDto => ({
  id: t.id,
  name: t.name,
  prefix: t.prefix,
  labId: t.lab.id,
  createdAt: t.createdAt.toISOString(),
  lastUsedAt: t.lastUsedAt?.toISOString() ?? null,
  expiresAt: t.expiresAt.toISOString(),
  revokedAt: t.revokedAt?.toISOString() ?? null,
});

export const auditDto = (a: AuditEventRow) => ({
  id: a.id,
  at: a.createdAt.toISOString(),
  kind: a.kind,
  actor: a.actor ? a.actor.email : null,
  subject: a.subject,
  ip: a.ip,
});

export const rigDto = (r: RigRow): RigDto => ({
  id: r.id,
  labId: r.lab.id,
  name: r.name,
  heatSource: r.heatSource,
  description: r.description,
  details: r.details,
  notes: r.notes,
  createdAt: r.createdAt.toISOString(),
  updatedAt: r.updatedAt.toISOString(),
});
