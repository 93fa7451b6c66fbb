import 'server-only';
import type { EntityManager } from '@mikro-orm/postgresql';
import { AuditEvent, Lab, type LabRow, type UserRow } from '@/entities';
import type { AuditKind } from '@/entities/audit-event';

/** Records a security event (persisted with the caller's next flush, or now with `flush: true`). */
export async function audit(
  em: EntityManager,
  e: { kind: AuditKind; actor?: UserRow | null; lab?: LabRow | string | null; subject?: string; ip?: string },
  flush = true,
): Promise<void> {
  const lab = typeof e.lab === 'string' ? em.getReference(Lab, e.lab) : (e.lab ?? null);
  em.create(AuditEvent, { kind: e.kind, actor: e.actor ?? null, lab, subject: (e.subject ?? '').slice(0, 300), ip: (e.ip ?? '').slice(0, 64) });
  if (flush) await em.flush();
}
