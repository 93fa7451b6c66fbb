import 'server-only';
import type { EntityManager } from '@mikro-orm/postgresql';
import { z } from 'zod';
import { TestSession, Trial, type FitRow, type RigRow, type TestSessionRow, type TrialRow, type UserRow } from '@/entities';
import type { TestSessionRun, TestSessionSettings } from '@/entities/test-session';
import { MAX_PLAN_TRIALS, MIN_PLAN_TRIALS, DEFAULT_OUTLET_U_K, predictRuns, priorFromFit, type PlanPrior } from '@/analysis/plan/plan-session';
import { runAnalysis } from '../server/analysis-pool';
import { PLANNABLE_MODELS } from '@/analysis/plan/model-response';
import { parseStoredFit } from '../fits/stored-fit';
import { fitsOfLab } from '../fits/fits';
import { quantity, trialDto } from '../rigs/trials';
import { conflict, invalid } from '../server/errors';

/** Most runs a session holds, planned and added (bounded work for the page, the fit and the drift check). */
export const MAX_SESSION_RUNS = 2 * MAX_PLAN_TRIALS;
export const SESSION_PRESETS = ['laboratory', 'collector', 'field'] as const;

/**
 * A session plan as the rig page's form and scripts send it: quantities as numbers in SI or
 * strings with their unit; the prior a saved fit of the lab (this rig's or another's) or a guess
 * of the coil's Ts and UA.
 */
export const sessionPlanInput = z
  .object({
    title: z.string().trim().min(1, 'Give the session a title.').max(160).optional(),
    prior: z
      .object({ fitId: z.string().uuid('Pick a saved fit.').optional(), Ts: quantity('temperature', 'prior.Ts').optional(), UA: quantity('conductance', 'prior.UA').optional() })
      .strict()
      .superRefine((p, ctx) => {
        if (p.fitId !== undefined) return;
        if (p.Ts === undefined) ctx.addIssue({ code: 'custom', path: ['Ts'], message: 'Give a guess of the source temperature, or pick a saved fit.' });
        if (p.UA === undefined) ctx.addIssue({ code: 'custom', path: ['UA'], message: 'Give a guess of UA, or pick a saved fit.' });
      }),
    inletTemp: quantity('temperature', 'inletTemp'),
    flowRange: z.tuple([quantity('volumeFlow', 'flowRange.0'), quantity('volumeFlow', 'flowRange.1')]),
    maxOutletTemp: quantity('temperature', 'maxOutletTemp'),
    trials: z.number().int().min(MIN_PLAN_TRIALS, `At least ${MIN_PLAN_TRIALS} runs: four distinct flows, the reference at start and end, a replicate.`).max(MAX_PLAN_TRIALS, `At most ${MAX_PLAN_TRIALS} runs.`),
    seed: z.number().int().min(0).max(2 ** 31 - 1).optional(),
    measurementUK: z.number().positive().max(20).optional(),
    preset: z.enum(SESSION_PRESETS).default('field'),
    /** plan only: answer the plan, store nothing */
    preview: z.boolean().optional(),
  })
  .strict();
export type SessionPlanBody = z.infer<typeof sessionPlanInput>;

/**
 * Plans a session from the body (planSession of analysis/plan) and, unless it is a preview, saves
 * it with the rig. `loadFit` loads a fit of the caller's lab (loadInLab).
 * @throws DomainError invalid naming the field (a fit whose model cannot be planned, a range or
 *   limit the plan refuses, no safe flow)
 */
export async function planForRig(em: EntityManager, rig: RigRow, user: UserRow, body: SessionPlanBody, loadFit: (id: string) => Promise<FitRow>) {
  let model = 'coil';
  let prior: PlanPrior;
  let priorSource: TestSessionSettings['prior'];
  if (body.prior.fitId) {
    const fit = await loadFit(body.prior.fitId);
    if (!(PLANNABLE_MODELS as readonly string[]).includes(fit.model)) throw invalid(`A session is planned for the coil or an exponential model; "${fit.title}" is a ${fit.model} fit.`, { 'prior.fitId': 'Pick a coil, exp-inlet or exp-approach fit.' });
    model = fit.model;
    prior = priorFromFit(parseStoredFit(fit.result, fit.id).fit);
    priorSource = { source: 'fit', fitId: fit.id, values: prior.values, covariance: prior.covariance, df: prior.df };
  } else {
    prior = { values: { Ts: body.prior.Ts!, UA: body.prior.UA! } };
    priorSource = { source: 'guess', fitId: null, values: prior.values };
  }
  const settings: TestSessionSettings = {
    model, prior: priorSource, inletTempC: body.inletTemp, flowRangeM3PerS: body.flowRange, maxOutletTempC: body.maxOutletTemp,
    trials: body.trials, seed: body.seed ?? Math.floor(Math.random() * 1e6), measurementUK: body.measurementUK ?? DEFAULT_OUTLET_U_K, preset: body.preset,
  };
  const computed = await runAnalysis('sessionPlan', { model, prior, inletTempC: settings.inletTempC, flowRangeM3PerS: settings.flowRangeM3PerS, maxOutletTempC: settings.maxOutletTempC, trials: settings.trials, seed: settings.seed, measurementUK: settings.measurementUK });
  if (!computed.ok) {
    const { error, reason } = computed as { error?: string; reason?: string };
    if (error) throw invalid(`The plan cannot be made: ${error}.`, { [fieldOf(error)]: error });
    throw invalid(`No safe plan: ${reason}.`, { flowRange: reason ?? 'no safe flow' }, 'no_safe_flow');
  }
  const plan = computed.plan;
  const runs: TestSessionRun[] = plan.runs.map((r, i) => ({
    key: `r${i + 1}`, order: r.order, flowM3PerS: r.flowM3PerS, predictedOutletTempC: r.predictedOutletTempC, piLowC: r.piLowC, piHighC: r.piHighC,
    inletSlope: computed.slopes[i], purpose: r.purpose, state: 'pending', trialIds: [],
  }));
  const { runs: _runs, ...rest } = plan;
  const planJson = JSON.parse(JSON.stringify(rest)) as Record<string, unknown>;
  if (body.preview) return { preview: true as const, settings, plan: planJson, runs };
  const title = body.title ?? `Session ${new Date().toISOString().slice(0, 16).replace('T', ' ')}`;
  const row = em.create(TestSession, { lab: rig.lab, rig, createdBy: user, title, state: 'planned', settings, plan: planJson, runs, sampleCount: 0 });
  await em.flush();
  return { preview: false as const, row };
}

const fieldOf = (message: string) => {
  const m = /^(inletTempC|maxOutletTempC|flowRangeM3PerS|trials|measurementUK|seed|prior)/.exec(message);
  return ({ inletTempC: 'inletTemp', maxOutletTempC: 'maxOutletTemp', flowRangeM3PerS: 'flowRange', trials: 'trials', measurementUK: 'measurementUK', seed: 'seed', prior: 'prior' } as Record<string, string>)[m?.[1] ?? ''] ?? 'prior';
};

/** A session's sessions of a rig, newest first. */
export const sessionsOfRig = (em: EntityManager, rig: RigRow) => em.find(TestSession, { rig }, { orderBy: { createdAt: 'desc' }, limit: 50 });

/** The trials of a session, in the order they were taken. */
export const sessionTrials = (em: EntityManager, s: TestSessionRow) => em.find(Trial, { session: s }, { orderBy: { startedAt: 'asc', id: 'asc' } });

/** The next run to do: the first pending run in order (null when the plan is done). */
export const nextPendingRun = (runs: readonly TestSessionRun[]) => [...runs].sort((a, b) => a.order - b.order).find((r) => r.state === 'pending') ?? null;

export const sessionListDto = (s: TestSessionRow) => ({
  id: s.id,
  rigId: s.rig.id,
  title: s.title,
  state: s.state,
  runs: s.runs.length,
  done: s.runs.filter((r) => r.state === 'done').length,
  createdAt: s.createdAt.toISOString(),
  studyId: s.study?.id ?? null,
});

export const sessionDto = (s: TestSessionRow, trials: readonly TrialRow[] = []) => ({
  ...sessionListDto(s),
  settings: s.settings,
  plan: s.plan,
  runs: s.runs,
  nextRun: nextPendingRun(s.runs),
  sampleCount: s.sampleCount,
  firstSampleAt: s.firstSampleAt?.toISOString() ?? null,
  lastSampleAt: s.lastSampleAt?.toISOString() ?? null,
  hasLog: !!s.sourceFile,
  closing: s.closing ?? null,
  closedAt: s.closedAt?.toISOString() ?? null,
  trials: trials.map(trialDto),
});
export type SessionDto = ReturnType<typeof sessionDto>;

export const runChange = z
  .object({
    action: z.enum(['skip', 'repeat', 'add', 'reopen']),
    runKey: z.string().regex(/^r\d{1,4}$/, 'Pick a run of the session.').optional(),
    flow: quantity('volumeFlow', 'flow').optional(),
  })
  .strict()
  .superRefine((b, ctx) => {
    if (b.action !== 'add' && !b.runKey) ctx.addIssue({ code: 'custom', path: ['runKey'], message: 'Pick the run to change.' });
    if (b.action === 'add' && b.flow === undefined) ctx.addIssue({ code: 'custom', path: ['flow'], message: 'Give the flow of the run to add.' });
  });

/** Refuses changes to a closed session (409). */
export function assertOpen(s: TestSessionRow) {
  if (s.state === 'closed') throw conflict('This session is closed: plan a new one to run more.', 'session_closed');
}

/**
 * Adapts the plan: skip a run, repeat one (a new pending run at the same flow, right after it),
 * add a run at a flow (predicted from the session's prior; refused above the outlet limit), or
 * reopen a skipped run.
 * @throws DomainError invalid for an unknown run or a flow outside the pump's range or over the limit; conflict for a closed session or too many runs
 */
export async function changeRuns(em: EntityManager, s: TestSessionRow, change: z.infer<typeof runChange>) {
  assertOpen(s);
  const runs = s.runs.map((r) => ({ ...r, trialIds: [...r.trialIds] }));
  const newKey = () => `r${Math.max(0, ...runs.map((r) => Number(r.key.slice(1)))) + 1}`;
  if (change.action === 'add' || change.action === 'repeat') {
    if (runs.length >= MAX_SESSION_RUNS) throw conflict(`A session holds at most ${MAX_SESSION_RUNS} runs.`, 'too_many_runs');
  }
  if (change.action === 'add') {
    const f = change.flow!;
    const [lo, hi] = s.settings.flowRangeM3PerS;
    if (!(f >= lo && f <= hi)) throw invalid('That flow is outside the pump\'s range of this session.', { flow: `between ${(lo * 60000).toFixed(2)} and ${(hi * 60000).toFixed(2)} L/min` });
    const p = predictRuns({ model: s.settings.model, prior: s.settings.prior, inletTempC: s.settings.inletTempC, measurementUK: s.settings.measurementUK }, [f])[0];
    if (!(p.piHighC <= s.settings.maxOutletTempC)) throw invalid(`At that flow the outlet could reach ${p.piHighC.toFixed(1)} °C, over the session's limit of ${s.settings.maxOutletTempC.toFixed(1)} °C.`, { flow: 'Pick a higher flow: the outlet could pass the limit.' });
    runs.push({ key: newKey(), order: Math.max(...runs.map((r) => r.order)) + 1, flowM3PerS: f, predictedOutletTempC: p.predictedOutletTempC, piLowC: p.piLowC, piHighC: p.piHighC, inletSlope: p.inletSlope, purpose: 'added', state: 'pending', trialIds: [] });
  } else {
    const run = runs.find((r) => r.key === change.runKey);
    if (!run) throw invalid('No such run in this session.', { runKey: 'Pick a run of the session.' });
    if (change.action === 'skip') {
      if (run.state !== 'pending') throw conflict('Only a pending run can be skipped.', 'not_pending');
      run.state = 'skipped';
    } else if (change.action === 'reopen') {
      if (run.state !== 'skipped') throw conflict('Only a skipped run can be taken up again.', 'not_skipped');
      run.state = 'pending';
    } else {
      for (const r of runs) if (r.order > run.order) r.order++;
      runs.push({ ...run, key: newKey(), order: run.order + 1, purpose: run.purpose === 'reference' ? 'reference' : 'replicate', state: 'pending', trialIds: [] });
    }
  }
  s.runs = runs.sort((a, b) => a.order - b.order);
  await em.flush();
  return s;
}

/** What the rig page's session panel shows: the rig's sessions and the lab's fits a plan can start from. */
export async function rigSessionsPanel(em: EntityManager, rig: RigRow) {
  const sessions = (await sessionsOfRig(em, rig)).map(sessionListDto);
  const fits = (await fitsOfLab(em, rig.lab, { limit: 100 }))
    .filter((f) => (PLANNABLE_MODELS as readonly string[]).includes(f.model))
    .map((f) => ({ id: f.id, title: f.title, version: f.version, model: f.model }));
  return { sessions, fits };
}
