import 'server-only';
/**
 * Review of fits and studies: draft → in review → approved / changes requested, one
 * `review_event` per step, comments, and the in-app notices and mail to the people concerned.
 * Owns `review_event`, `comment` and `notice`; may import labs (permissions, audit), mail and
 * server. Fits and studies call it; it knows neither.
 */
import type { EntityManager } from '@mikro-orm/postgresql';
import { z } from 'zod';
import { Comment, Membership, Notice, ReviewEvent, User, type LabRow, type UserRow } from '@/entities';
import type { ReviewState } from '@/entities/review';
import type { Role } from '@/entities/membership';
import { conflict, forbidden, DomainError } from '../server/errors';
import { audit } from '../labs/audit';
import { appLink, sendMail } from '../mail/mail';
import { can, type Action } from '../labs/permissions';

/** Review moves: who may make them, and from which states. */
const MOVES: Record<string, { action: Action; from: ReviewState[]; to: ReviewState; verb: string; decision: boolean; audit: 'review-submitted' | 'review-approved' | 'review-returned' }> = {
  submit: { action: 'fit:write', from: ['draft', 'changes-requested'], to: 'in-review', verb: 'asked for review of', decision: false, audit: 'review-submitted' },
  approve: { action: 'review:decide', from: ['in-review'], to: 'approved', verb: 'approved', decision: true, audit: 'review-approved' },
  'request-changes': { action: 'review:decide', from: ['in-review'], to: 'changes-requested', verb: 'asked for changes to', decision: true, audit: 'review-returned' },
};
export const reviewInput = z.object({ move: z.enum(['submit', 'approve', 'request-changes']), note: z.string().trim().max(4000).default('') }).strict();

/**
 * Moves a fit or study through draft → in review → approved / changes requested, records the
 * step, and tells the author (in-app notice and e-mail) or, on submission, the lab's reviewers.
 * Nobody decides on their own work: `ownerIds` (a fit's author; a study's author and everyone who
 * saved it since its last decision) may submit, never approve or return — whatever their role.
 */
export async function review(
  em: EntityManager,
  target: { kind: 'fit' | 'study'; id: string; title: string; lab: LabRow; reviewState: ReviewState; authorId: string | null; ownerIds: string[]; link: string },
  actor: UserRow,
  role: Role,
  input: z.infer<typeof reviewInput>,
  ip: string,
): Promise<ReviewState> {
  const move = MOVES[input.move];
  if (!can(role, move.action)) throw forbidden();
  if (move.decision && target.ownerIds.includes(actor.id)) {
    throw new DomainError('forbidden', 'own_work', `You ${target.authorId === actor.id ? 'made' : 'edited'} this ${target.kind}: another reviewer or owner must approve or return it.`);
  }
  if (!move.from.includes(target.reviewState)) throw conflict(`It is ${target.reviewState}; it cannot be ${move.to} from there.`);
  await audit(em, { kind: move.audit, actor, lab: target.lab, subject: `${target.kind} "${target.title}"`.slice(0, 300), ip }, false);
  em.create(ReviewEvent, { lab: target.lab, actor, targetKind: target.kind, targetId: target.id, fromState: target.reviewState, toState: move.to, note: input.note });
  const recipients =
    input.move === 'submit'
      ? (await em.find(Membership, { lab: target.lab, role: { $in: ['reviewer', 'owner'] } }, { populate: ['user'] })).map((m) => m.user).filter((u) => u.id !== actor.id)
      : target.authorId && target.authorId !== actor.id
        ? [await em.findOneOrFail(User, { id: target.authorId })]
        : [];
  const text = `${actor.name} ${move.verb} the ${target.kind} "${target.title}".`;
  for (const u of recipients) em.create(Notice, { user: u, lab: target.lab, text: text.slice(0, 300), link: target.link });
  await em.flush();
  for (const u of recipients) {
    await sendMail(u.email, {
      subject: input.move === 'submit' ? `Review requested: ${target.title}` : `${move.to === 'approved' ? 'Approved' : 'Changes requested'}: ${target.title}`,
      paragraphs: [text, ...(input.note ? [`Note: ${input.note}`] : []), `Lab: ${target.lab.name}.`],
      action: { label: `Open the ${target.kind}`, url: appLink(target.link) },
    }, { kind: 'review', labId: target.lab.id });
  }
  return move.to;
}

/** A lab's latest saved fits (at most `limit`), newest first, with their rigs. */
export const commentInput = z.object({ body: z.string().trim().min(1, 'Write something.').max(8000), blockId: z.string().max(40).optional() }).strict();

export async function addComment(em: EntityManager, lab: LabRow, author: UserRow, targetKind: 'fit' | 'study' | 'comparison', targetId: string, input: z.infer<typeof commentInput>) {
  const c = em.create(Comment, { lab, author, targetKind, targetId, blockId: input.blockId ?? null, body: input.body });
  await em.flush();
  return c;
}

export async function reviewTrail(em: EntityManager, targetKind: 'fit' | 'study' | 'comparison', targetId: string) {
  const [comments, events] = await Promise.all([
    em.find(Comment, { targetKind, targetId }, { orderBy: { createdAt: 'asc' } }),
    // comparisons take comments, not review decisions
    targetKind === 'comparison' ? [] : em.find(ReviewEvent, { targetKind, targetId }, { orderBy: { createdAt: 'asc' } }),
  ]);
  // the people, by key, in one query for both lists
  const people = [...new Set([...comments.map((c) => c.author?.id), ...events.map((e) => e.actor?.id)].filter((x): x is string => !!x))];
  if (people.length) await em.find(User, { id: { $in: people } });
  return {
    comments: comments.map((c) => ({ id: c.id, at: c.createdAt.toISOString(), by: c.author?.name ?? null, blockId: c.blockId ?? null, body: c.body })),
    events: events.map((e) => ({ at: e.createdAt.toISOString(), by: e.actor?.name ?? null, from: e.fromState, to: e.toState, note: e.note })),
  };
}

/** The viewer's latest notices (newest first), marked read as they are shown. */
export async function takeNotices(em: EntityManager, user: UserRow, limit = 100) {
  const notices = await em.find(Notice, { user }, { populate: ['lab'], orderBy: { createdAt: 'desc' }, limit });
  await em.nativeUpdate(Notice, { user, readAt: null }, { readAt: new Date() });
  return notices;
}

