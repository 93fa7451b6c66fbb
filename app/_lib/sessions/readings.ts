import 'server-only';
import type { EntityManager } from '@mikro-orm/postgresql';
import { LockMode } from '@mikro-orm/core';
import { z } from 'zod';
import { TestSession, Trial, type TestSessionRow, type TrialRow } from '@/entities';
import type { TestSessionRun } from '@/entities/test-session';
import { checkReading, driftCheck, type DriftCheck, type ReadingCheck } from '@/analysis/plan/reading-check';
import { apiTrialsToRows, trialInput } from '../rigs/trials';
import { trialFields } from '../rigs/trial-rule';
import { conflict, invalid, notFound } from '../server/errors';
import { assertOpen } from './sessions';

/**
 * A reading typed at the rig: a trial of the API's shape (checked by the one trial rule) with the
 * id the phone gave it (so a retry or a queued entry synced twice is the same trial) and the run it
 * belongs to.
 */
export const readingInput = trialInput.extend({
  id: z.string().uuid('The reading needs an id (a UUID made by the phone).'),
  runKey: z.string().regex(/^r\d{1,4}$/, 'Pick a run of the session.'),
});
export type ReadingInput = z.infer<typeof readingInput>;

/** The session's source temperature for the drift check: the prior's Ts (coil), else none. */
const sourceTemp = (s: TestSessionRow) => (typeof s.settings.prior.values.Ts === 'number' ? s.settings.prior.values.Ts : null);

/** The drift check over the session's reference trials, in the order taken. */
export function sessionDrift(s: TestSessionRow, trials: readonly TrialRow[]): DriftCheck {
  const refKeys = new Set(s.runs.filter((r) => r.purpose === 'reference').flatMap((r) => r.trialIds));
  const refs = trials.filter((t) => refKeys.has(t.id) && !t.excluded).sort((a, b) => a.startedAt.getTime() - b.startedAt.getTime());
  return driftCheck(refs.map((t) => ({ inletTempC: t.inletTempC, outletTempC: t.outletTempC })), s.settings.measurementUK, sourceTemp(s));
}

const prediction = (s: TestSessionRow, run: TestSessionRun) => ({
  predictedOutletTempC: run.predictedOutletTempC, piLowC: run.piLowC, piHighC: run.piHighC, inletSlope: run.inletSlope, planInletTempC: s.settings.inletTempC,
});

/**
 * Saves a reading of a run as a trial of the session, through the one trial rule, in one
 * transaction holding the session row: the same id again returns the trial already saved (no
 * duplicate); a reading outside the run's prediction interval is kept with a note (questioned,
 * never refused). Returns the trial, the check, and the drift check when the run is a reference.
 * @throws DomainError invalid (the trial rule, an unknown run), conflict (a closed session, an id used elsewhere)
 */
export async function addReading(em: EntityManager, sessionId: string, input: ReadingInput, origin: 'manual' | 'api') {
  const [checked] = apiTrialsToRows([input], false);
  return em.transactional(async (tx) => {
    const s = await tx.findOne(TestSession, { id: sessionId }, { lockMode: LockMode.PESSIMISTIC_WRITE, refresh: true });
    if (!s) throw notFound();
    const existing = await tx.findOne(Trial, { id: input.id });
    if (existing) {
      if (existing.session?.id !== s.id) throw conflict('That reading id is used by another trial.', 'id_taken');
      const trials = await tx.find(Trial, { session: s });
      const run = s.runs.find((r) => r.trialIds.includes(existing.id)) ?? null;
      return { trial: existing, duplicate: true, check: run ? checkReading(prediction(s, run), existing) : null, drift: run?.purpose === 'reference' ? sessionDrift(s, trials) : null, session: s };
    }
    assertOpen(s);
    const runs = s.runs.map((r) => ({ ...r, trialIds: [...r.trialIds] }));
    const run = runs.find((r) => r.key === input.runKey);
    if (!run) throw invalid('No such run in this session.', { runKey: 'Pick a run of the session.' });
    const check: ReadingCheck = checkReading(prediction(s, run), checked.row);
    const note = check.inside ? '' : `Outside the predicted ${check.piLowC.toFixed(1)}–${check.piHighC.toFixed(1)} °C; kept.`;
    const fields = trialFields(checked.row, checked.startedAt);
    const trial = tx.create(Trial, {
      ...fields, id: input.id, lab: s.lab, rig: s.rig, session: s, origin,
      isReference: run.purpose === 'reference' || fields.isReference,
      notes: [fields.notes, `Session "${s.title}", run ${run.order}.`, note].filter(Boolean).join(' '),
    });
    run.trialIds.push(trial.id);
    run.state = 'done';
    s.runs = runs;
    if (s.state === 'planned') s.state = 'running';
    await tx.flush();
    const trials = await tx.find(Trial, { session: s });
    return { trial, duplicate: false, check, drift: run.purpose === 'reference' ? sessionDrift(s, trials) : null, session: s, warnings: checked.warnings };
  });
}
