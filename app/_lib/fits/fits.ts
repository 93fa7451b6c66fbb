import 'server-only';
import type { EntityManager } from '@mikro-orm/postgresql';
import { z } from 'zod';
import { Comment, Fit, Membership, Notice, ReviewEvent, User, type FitRow, type LabRow, type RigRow, type UserRow } from '@/entities';
import type { ReviewState } from '@/entities/review';
import { compareModels, type FitSuccess } from '@/analysis/fit';
import { conflict, forbidden, HttpError } from '../server/errors';
import { DEFAULT_MEASUREMENT_SD_K, MAX_FIT_TRIALS, SOFTWARE_VERSION, fitData, modelLabel, trialsForFit, trialsHash } from './fit-analysis';
import { parseStoredFit, storedFitResult } from './stored-fit';
import { audit } from '../labs/audit';
import { appLink, sendMail } from '../mail/mail';
import { can, type Action } from '../labs/permissions';
import type { Role } from '@/entities/membership';

export const saveFitInput = z
  .object({
    title: z.string().trim().min(1, 'Give the fit a title.').max(160),
    model: z.string().trim().min(1).max(400),
    trialIds: z.array(z.string().uuid()).min(2).max(MAX_FIT_TRIALS),
    compareWith: z.array(z.string().trim().min(1).max(400)).max(5).default([]),
    measurementSdK: z.number().positive().max(20).default(DEFAULT_MEASUREMENT_SD_K),
    planInletC: z.number().min(0).max(99).optional(),
  })
  .strict();

/**
 * Saves a fit as an immutable record. The numbers are recomputed here from the stored trials
 * (never taken from the browser); a fit of the same title on the same rig becomes its next version.
 */
export async function saveFit(em: EntityManager, rig: RigRow, user: UserRow, input: z.infer<typeof saveFitInput>): Promise<FitRow> {
  const trials = await trialsForFit(em, rig, input.trialIds);
  const data = fitData(trials);
  const models = [input.model, ...input.compareWith.filter((m) => m !== input.model)];
  const comparison = compareModels({ ...data, measurementSD: input.measurementSdK }, models.map((m) => ({ label: modelLabel(m), model: m })));
  const mine = comparison.ranking.find((r) => r.model === input.model);
  if (!mine?.ok || !mine.fit) throw new HttpError(422, 'fit_failed', `The ${modelLabel(input.model)} model cannot be fitted to these trials: ${mine?.reason ?? 'unknown reason'}`);
  const fit: FitSuccess = mine.fit;
  const meanTin = data.covariates.Tin.reduce((a, b) => a + b, 0) / trials.length;
  const planInletC = input.planInletC ?? Math.round(meanTin * 10) / 10;
  const previous = await em.findOne(Fit, { rig, title: input.title }, { orderBy: { version: 'desc' } });
  const row = em.create(Fit, {
    lab: rig.lab,
    rig,
    createdBy: user,
    title: input.title,
    version: (previous?.version ?? 0) + 1,
    previous: previous ?? null,
    model: input.model,
    trialIds: trials.map((t) => t.id),
    trialsHash: trialsHash(trials),
    settings: { measurementSdK: input.measurementSdK, planInletC, compareWith: input.compareWith, x: 'volume flow, m³/s', y: 'outlet temperature, °C' },
    result: storedFitResult(fit, comparison, planInletC, trials) as unknown as Record<string, unknown>,
    softwareVersion: SOFTWARE_VERSION,
  });
  await em.flush();
  return row;
}

export const fitListDto = (f: FitRow) => ({
  id: f.id,
  rigId: f.rig.id,
  title: f.title,
  version: f.version,
  model: f.model,
  modelLabel: modelLabel(f.model),
  n: f.trialIds.length,
  reviewState: f.reviewState,
  createdAt: f.createdAt.toISOString(),
  createdBy: f.createdBy?.name ?? null,
});

export const fitDto = (f: FitRow) => ({ ...fitListDto(f), trialIds: f.trialIds, trialsHash: f.trialsHash, settings: f.settings, result: parseStoredFit(f.result, f.id), softwareVersion: f.softwareVersion });

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
    throw new HttpError(403, 'own_work', `You ${target.authorId === actor.id ? 'made' : 'edited'} this ${target.kind}: another reviewer or owner must approve or return it.`);
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

export const commentInput = z.object({ body: z.string().trim().min(1, 'Write something.').max(8000), blockId: z.string().max(40).optional() }).strict();

export async function addComment(em: EntityManager, lab: LabRow, author: UserRow, targetKind: 'fit' | 'study', targetId: string, input: z.infer<typeof commentInput>) {
  const c = em.create(Comment, { lab, author, targetKind, targetId, blockId: input.blockId ?? null, body: input.body });
  await em.flush();
  return c;
}

export async function reviewTrail(em: EntityManager, targetKind: 'fit' | 'study', targetId: string) {
  const [comments, events] = await Promise.all([
    em.find(Comment, { targetKind, targetId }, { populate: ['author'], orderBy: { createdAt: 'asc' } }),
    em.find(ReviewEvent, { targetKind, targetId }, { populate: ['actor'], orderBy: { createdAt: 'asc' } }),
  ]);
  return {
    comments: comments.map((c) => ({ id: c.id, at: c.createdAt.toISOString(), by: c.author?.name ?? null, blockId: c.blockId ?? null, body: c.body })),
    events: events.map((e) => ({ at: e.createdAt.toISOString(), by: e.actor?.name ?? null, from: e.fromState, to: e.toState, note: e.note })),
  };
}
