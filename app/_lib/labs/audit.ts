import 'server-only';
import type { EntityManager } from '@mikro-orm/postgresql';
import { AuditEvent, Lab, User, type LabRow, type UserRow } from '@/entities';
import type { AuditKind } from '@/entities/audit-event';
import { getEm } from '../server/db';
import { countAttempt } from '../server/rate-limit';

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

/** At most this many refused (403) or rate-limited (429) requests are recorded per address or account per hour. */
export const REFUSALS_RECORDED_PER_HOUR = 20;

/**
 * Records a refused (403) or rate-limited (429) request, bounded so that a flood of refused
 * requests cannot flood the log: per client address and per account, the first
 * {@link REFUSALS_RECORDED_PER_HOUR} of an hour are recorded, the one after them as a note that
 * further refusals of that hour are counted but not recorded. Never throws: the answer to the
 * client does not depend on the log.
 */
export async function auditRefusal(
  requestEm: EntityManager | undefined,
  r: { status: 403 | 429 | number; what: string; actor: UserRow | null; lab: string | null; ip: string },
): Promise<void> {
  try {
    // A fresh fork: the request's own EntityManager may hold a failed unit of work.
    const em = requestEm ? requestEm.fork() : await getEm();
    const who = r.actor ? `account:${r.actor.id}` : `ip:${r.ip || 'unknown'}`;
    const n = await countAttempt(em, { key: `audit-refusal:${who}`, max: REFUSALS_RECORDED_PER_HOUR, windowS: 3600 });
    if (n > REFUSALS_RECORDED_PER_HOUR + 1) return;
    const kind: AuditKind = r.status === 429 ? 'rate-limited' : 'request-refused';
    const subject = n > REFUSALS_RECORDED_PER_HOUR ? `${r.what} (further refusals this hour are not recorded)` : r.what;
    await audit(em, { kind, actor: r.actor ? em.getReference(User, r.actor.id) : null, lab: r.lab, subject, ip: r.ip });
  } catch (e) {
    console.error('audit of a refused request failed:', e instanceof Error ? e.message : e);
  }
}
