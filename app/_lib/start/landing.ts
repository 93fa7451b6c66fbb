import 'server-only';
/**
 * What a member does next, by role — the page a person lands on after signing in: an engineer's
 * open work (drafts and returned fits and studies, with the reviewer's last word), a reviewer's
 * queue (work in review that someone else made), a viewer's studies (approved, then in review, then the rest) and comparisons to read and
 * export, an owner's team (members, open invitations) above the queue. Lists of the current lab
 * only, each bounded.
 */
import type { EntityManager } from '@mikro-orm/postgresql';
import { Comment, Fit, Study, type LabRow, type UserRow } from '@/entities';
import type { Role } from '@/entities/membership';
import { comparisonsOfLab } from '../comparisons/comparisons';
import { invitationsOf, membersOf } from '../labs/labs';
import { loadRefs } from '../server/db';

const LIMIT = 20;

export interface WorkItem {
  kind: 'fit' | 'study' | 'comparison';
  href: string;
  title: string;
  state: string | null;
  /** who made it, and the last comment on it (the reviewer's word), when there is one */
  by: string | null;
  lastComment: string | null;
  at: string;
}

async function lastComments(em: EntityManager, ids: string[]) {
  if (!ids.length) return new Map<string, string>();
  const rows = await em.find(Comment, { targetId: { $in: ids } }, { orderBy: { createdAt: 'asc' }, populate: ['author'] });
  return new Map(rows.map((c) => [c.targetId, `${c.author?.name ?? 'someone'}: ${c.body}`]));
}

async function items(em: EntityManager, lab: LabRow, where: { states: string[]; mine?: UserRow; notMine?: UserRow }): Promise<WorkItem[]> {
  const by = where.mine ? { createdBy: where.mine } : where.notMine ? { createdBy: { $ne: where.notMine } } : {};
  const [fits, studies] = await Promise.all([
    em.find(Fit, { lab, reviewState: { $in: where.states as never[] }, ...by }, { populate: ['createdBy', 'rig'], orderBy: { createdAt: 'desc' }, limit: LIMIT }),
    em.find(Study, { lab, reviewState: { $in: where.states as never[] }, ...by }, { populate: ['createdBy'], orderBy: { updatedAt: 'desc' }, limit: LIMIT }),
  ]);
  const notes = await lastComments(em, [...fits.map((f) => f.id), ...studies.map((s) => s.id)]);
  return [
    ...fits.map((f): WorkItem => ({ kind: 'fit', href: `/fits/${f.id}`, title: `${f.title} v${f.version} (${f.rig.name})`, state: f.reviewState, by: f.createdBy?.name ?? null, lastComment: notes.get(f.id) ?? null, at: f.createdAt.toISOString() })),
    ...studies.map((s): WorkItem => ({ kind: 'study', href: `/studies/${s.id}`, title: s.title, state: s.reviewState, by: s.createdBy?.name ?? null, lastComment: notes.get(s.id) ?? null, at: s.updatedAt.toISOString() })),
  ];
}

/** The landing of `role` in `lab` for `user`. */
export async function landingFor(em: EntityManager, lab: LabRow, user: UserRow, role: Role) {
  const comparisons = (await comparisonsOfLab(em, lab)).slice(0, LIMIT).map((c): WorkItem => ({ kind: 'comparison', href: `/comparisons/${c.id}`, title: c.title, state: null, by: c.createdBy?.name ?? null, lastComment: null, at: c.createdAt.toISOString() }));
  if (role === 'viewer') {
    // what is ready to read first (approved, then in review), then the rest; newest first within each
    const ready = await em.find(Study, { lab, reviewState: { $in: ['approved', 'in-review'] } }, { orderBy: { updatedAt: 'desc' }, limit: LIMIT });
    const rest = ready.length < LIMIT ? await em.find(Study, { lab, reviewState: { $nin: ['approved', 'in-review'] } }, { orderBy: { updatedAt: 'desc' }, limit: LIMIT - ready.length }) : [];
    const studies = [...ready.filter((s) => s.reviewState === 'approved'), ...ready.filter((s) => s.reviewState !== 'approved'), ...rest];
    await loadRefs(em, studies, ['createdBy']);
    return {
      role,
      studies: studies.map((s): WorkItem => ({ kind: 'study', href: `/studies/${s.id}`, title: s.title, state: s.reviewState, by: s.createdBy?.name ?? null, lastComment: null, at: s.updatedAt.toISOString() })),
      comparisons,
    };
  }
  if (role === 'reviewer') return { role, queue: await items(em, lab, { states: ['in-review'], notMine: user }), comparisons };
  if (role === 'engineer') {
    return {
      role,
      open: await items(em, lab, { states: ['draft', 'changes-requested'], mine: user }),
      waiting: await items(em, lab, { states: ['in-review'], mine: user }),
      comparisons,
    };
  }
  const [members, invitations] = await Promise.all([membersOf(em, lab), invitationsOf(em, lab, { open: true })]);
  return {
    role,
    members: members.map((m) => ({ id: m.id, name: m.user.name, email: m.user.email, role: m.role })),
    invitations: invitations.map((i) => ({ email: i.email, role: i.role, expiresAt: i.expiresAt.toISOString() })),
    queue: await items(em, lab, { states: ['in-review'], notMine: user }),
  };
}
export type Landing = Awaited<ReturnType<typeof landingFor>>;
