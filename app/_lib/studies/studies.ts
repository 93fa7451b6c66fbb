import 'server-only';
import { randomUUID } from 'node:crypto';
import type { EntityManager } from '@mikro-orm/postgresql';
import { z } from 'zod';
import { ShareLink, Study, type LabRow, type ShareLinkRow, type StudyRow, type UserRow } from '@/entities';
import { BLOCK_KINDS, type StudyBlock } from '@/entities/study';
import { UNIT_SYSTEMS, type UnitSystem } from '@/analysis/units/unit-system';
import { costBlockData } from '../forecasts/cost-sheet';
import { tubFillBlockData } from '../forecasts/tub-fill';
import { forecastWorkProblem } from '../forecasts/forecasts';
import { conflict, DomainError } from '../server/errors';
import { isUuid } from '../labs/load-in-lab';
import { newSecret, sha256 } from '../server/secrets';

export const blockSchema = z
  .object({
    id: z.string().min(1).max(40),
    kind: z.enum(BLOCK_KINDS),
    data: z.record(z.string(), z.unknown()).default({}),
  })
  .strict()
  .superRefine((b, ctx) => {
    if (b.kind === 'text' && typeof b.data.markdown === 'string' && b.data.markdown.length > 50_000) ctx.addIssue({ code: 'custom', message: 'A text block holds at most 50,000 characters.' });
    if (['fit', 'comparison', 'performance', 'trials'].includes(b.kind) && b.data.fitId !== undefined && (!isUuid(b.data.fitId))) {
      ctx.addIssue({ code: 'custom', path: ['data', 'fitId'], message: 'Pick a saved fit.' });
    }
    if (b.kind === 'design-comparison' && b.data.comparisonId !== undefined && !isUuid(b.data.comparisonId)) {
      ctx.addIssue({ code: 'custom', path: ['data', 'comparisonId'], message: 'Pick a saved design comparison.' });
    }
    if (b.kind === 'operating-plan' && b.data.planId !== undefined && !isUuid(b.data.planId)) {
      ctx.addIssue({ code: 'custom', path: ['data', 'planId'], message: 'Pick a saved operating plan.' });
    }
    if (b.kind === 'sensor-log' && b.data.sourceFileId !== undefined && (!isUuid(b.data.sourceFileId))) {
      ctx.addIssue({ code: 'custom', path: ['data', 'sourceFileId'], message: 'Pick an imported sensor log.' });
    }
    if (b.kind === 'forecast') {
      const problem = forecastWorkProblem(b.data);
      if (problem) ctx.addIssue({ code: 'custom', path: ['data'], message: `Forecast: ${problem}` });
    }
    if (b.kind === 'tub-fill') {
      const t = tubFillBlockData.safeParse(b.data);
      if (!t.success) for (const i of t.error.issues) ctx.addIssue({ code: 'custom', path: ['data', ...i.path.map(String)], message: `Tub fill: ${i.path.join('.') || 'settings'}: ${i.message}` });
      else if (b.data.fitId !== undefined && !isUuid(b.data.fitId)) ctx.addIssue({ code: 'custom', path: ['data', 'fitId'], message: 'Tub fill: fitId: pick a saved coil fit.' });
    }
    if (b.kind === 'costs') {
      const c = costBlockData.safeParse(b.data);
      if (!c.success) for (const i of c.error.issues) ctx.addIssue({ code: 'custom', path: ['data', ...i.path.map(String)], message: `Cost sheet: ${i.path.join('.') || 'settings'}: ${i.message}` });
    }
  });

/** Forecast blocks run whenever a study, its share link or its export is read: a study holds only a few. */
export const MAX_FORECAST_BLOCKS = 10;

export const studyCreate = z.object({ title: z.string().trim().min(1, 'Give the study a title.').max(160) }).strict();
export const studySave = z
  .object({
    title: z.string().trim().min(1).max(160),
    blocks: z
      .array(blockSchema)
      .max(100, 'A study holds at most 100 blocks.')
      .refine((bs) => bs.filter((b) => b.kind === 'forecast').length <= MAX_FORECAST_BLOCKS, `A study holds at most ${MAX_FORECAST_BLOCKS} forecast blocks (each one runs when the study is read).`),
    /** the revision the editor loaded; a different current revision is a conflict */
    baseRevision: z.number().int().min(1),
  })
  .strict();

export function newStudy(em: EntityManager, lab: LabRow, user: UserRow, title: string): StudyRow {
  const blocks: StudyBlock[] = [
    { id: randomUUID().slice(0, 8), kind: 'text', data: { markdown: `## ${title}\n\nWhat was tested, how, and what we found.` } },
    { id: randomUUID().slice(0, 8), kind: 'caution', data: {} },
  ];
  return em.create(Study, { lab, createdBy: user, updatedBy: user, title, blocks });
}

/**
 * Saves an edit made against `baseRevision`. If someone saved in between, nothing is written and
 * the caller gets 409 with the current version, so the editor can show the conflict.
 */
export async function saveStudy(em: EntityManager, study: StudyRow, user: UserRow, input: z.infer<typeof studySave>) {
  const ids = new Set<string>();
  for (const b of input.blocks) {
    if (ids.has(b.id)) throw new DomainError('invalid', 'invalid', `Two blocks share the id ${b.id}.`);
    ids.add(b.id);
  }
  // Conditional update: only if the row is still at the revision the editor saw (atomic across instances).
  const updated = await em.nativeUpdate(
    Study,
    { id: study.id, revision: input.baseRevision },
    {
      title: input.title,
      blocks: input.blocks as StudyBlock[],
      revision: input.baseRevision + 1,
      updatedBy: user,
      updatedAt: new Date(),
      editedSinceReview: [...new Set([...(study.editedSinceReview ?? []), user.id])],
      // an approval covers the revision it saw: an edit sends the study back to draft
      ...(study.reviewState === 'approved' ? { reviewState: 'draft' as const } : {}),
    },
  );
  if (!updated) {
    await em.refresh(study);
    throw new DomainError('conflict', 'edit_conflict', `Someone else saved this study (${study.updatedBy?.name ?? 'another editor'}); your edit was not saved. Compare and choose.`, {
      current: studyDto(study),
    });
  }
  await em.refresh(study);
  return study;
}

export const studyListDto = (s: StudyRow) => ({ id: s.id, title: s.title, reviewState: s.reviewState, revision: s.revision, updatedAt: s.updatedAt.toISOString(), blocks: s.blocks.length });
export const studyDto = (s: StudyRow) => ({ ...studyListDto(s), blocks: s.blocks, createdBy: s.createdBy?.id ?? null, updatedBy: s.updatedBy?.name ?? null });

export const shareInput = z.object({ days: z.number().int().min(1).max(365).default(30) }).strict();

export async function createShare(em: EntityManager, study: StudyRow, user: UserRow, days: number) {
  const { token, hash } = newSecret('shr_', 24);
  const link = em.create(ShareLink, { lab: study.lab, study, createdBy: user, tokenHash: hash, expiresAt: new Date(Date.now() + days * 86_400_000) });
  await em.flush();
  return { link, token };
}

/** A lab's studies, latest edited first (at most 200). */
export const studiesOfLab = (em: EntityManager, lab: LabRow | string) => em.find(Study, { lab }, { orderBy: { updatedAt: 'desc' }, limit: 200 });

/** A study's share links, newest first. */
export const sharesOfStudy = (em: EntityManager, study: StudyRow) => em.find(ShareLink, { study }, { orderBy: { createdAt: 'desc' } });

export const shareDto = (l: ShareLinkRow) => ({
  id: l.id,
  createdAt: l.createdAt.toISOString(),
  expiresAt: l.expiresAt.toISOString(),
  revokedAt: l.revokedAt?.toISOString() ?? null,
});

/** The study behind a share token, or null when unknown, revoked or expired. */
export async function sharedStudy(em: EntityManager, token: string) {
  const link = await em.findOne(ShareLink, { tokenHash: sha256(token) }, { populate: ['study', 'lab'] });
  if (!link || link.revokedAt || link.expiresAt <= new Date()) return null;
  return link;
}

/**
 * The units of the public share view: the reader's explicit choice (`?units=si|us`), else a
 * signed-in reader's own preference, else SI.
 */
export function shareUnits(param: string | null | undefined, preference?: UnitSystem | null): UnitSystem {
  if ((UNIT_SYSTEMS as readonly (string | null | undefined)[]).includes(param)) return param as UnitSystem;
  return preference === 'us' ? 'us' : 'si';
}

/** The people who may not decide the study's review: its author and everyone who saved it since the last decision. */
export function studyOwners(study: StudyRow): string[] {
  return [...new Set([...(study.createdBy ? [study.createdBy.id] : []), ...(study.editedSinceReview ?? [])])];
}

export function assertEditable(study: StudyRow) {
  if (study.reviewState === 'in-review') throw conflict('The study is in review: wait for the reviewer’s decision before editing.');
}
