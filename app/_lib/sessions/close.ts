import 'server-only';
import type { EntityManager } from '@mikro-orm/postgresql';
import { LockMode } from '@mikro-orm/core';
import { randomUUID } from 'node:crypto';
import { TestSession, Trial, type TestSessionRow, type UserRow } from '@/entities';
import type { StudyBlock } from '@/entities/study';
import { fitData, modelLabel } from '../fits/fit-analysis';
import { saveFit } from '../fits/fits';
import { newStudy } from '../studies/studies';
import { conflict, notFound } from '../server/errors';
import { runAnalysis } from '../server/analysis-pool';
import { sessionDrift } from './readings';
import { liveAndRecord } from './samples';


const f2 = (x: number) => (Math.abs(x) >= 100 ? x.toFixed(0) : x.toPrecision(3));

/** The verdict of a closed session (stored in `closing`), SI. */
export interface SessionClosing {
  closedAt: string;
  trials: number;
  runsDone: number;
  runsSkipped: number;
  fit: { ok: true; model: string; label: string; params: Record<string, { value: number; stdErr: number; ciLow: number | null; ciHigh: number | null }>; residualSD: number; r2: number | null; df: number } | { ok: false; reason: string };
  lackOfFit: { tested: boolean; pValue: number | null; verdict: string };
  drift: ReturnType<typeof sessionDrift>;
  /** each parameter's standard error after the session against what the plan expected */
  stdErr: { name: string; fitted: number | null; planned: number | null; ratio: number | null }[];
  nextRun: { ok: true; flowM3PerS: number; predictedOutletTempC: number; piLowC: number; piHighC: number; targetParameter: string; relativeStdErrNow: number; relativeStdErrAfter: number } | { ok: false; reason: string };
  summary: string[];
}

/**
 * Closes a session: the logger's last steady period (if any) becomes a trial, then the fit of the
 * plan's model on the session's included trials, in the analysis worker pool (session-compute.ts; replicates within 5 %, so
 * the pure-error lack-of-fit test has its groups), the drift verdict over the reference runs, the
 * standard errors against the plan's expectation, and the single next run that cuts the largest
 * relative standard error most (analysis/plan nextRun). Closing again returns the stored verdict.
 */
export async function closeSession(em: EntityManager, sessionId: string): Promise<TestSessionRow> {
  return em.transactional(async (tx) => {
    const s = await tx.findOne(TestSession, { id: sessionId }, { lockMode: LockMode.PESSIMISTIC_WRITE, refresh: true });
    if (!s) throw notFound();
    if (s.state === 'closed') return s;
    await liveAndRecord(tx, s, true);
    await tx.flush();
    const all = await tx.find(Trial, { session: s }, { orderBy: { startedAt: 'asc', id: 'asc' } });
    const trials = all.filter((t) => !t.excluded);
    const st = s.settings;
    const expected = (s.plan.expectedStdErr ?? {}) as Record<string, number>;
    let fit: Extract<Awaited<ReturnType<typeof runAnalysis<'sessionFit'>>>, { ok: true }> | null = null;
    let reason = 'fewer than three included trials';
    if (trials.length >= 3) {
      const r = await runAnalysis('sessionFit', { data: fitData(trials), model: st.model, measurementUK: st.measurementUK, inletTempC: st.inletTempC, flowRangeM3PerS: st.flowRangeM3PerS, maxOutletTempC: st.maxOutletTempC });
      if (r.ok) fit = r;
      else reason = r.reason;
    }
    const drift = sessionDrift(s, all);
    const lof = fit?.lackOfFit;
    const lackOfFit = lof && lof.ok
      ? { tested: true, pValue: lof.pValue, verdict: lof.pValue < 0.05 ? `The model does not fit within the scatter of the replicates (lack of fit, p = ${lof.pValue.toFixed(3)}).` : `No lack of fit the replicates can show (p = ${lof.pValue.toFixed(2)}).` }
      : { tested: false, pValue: null, verdict: lof && !lof.ok ? `Lack of fit not tested: ${lof.reason}.` : 'Lack of fit not tested: no flow was run twice.' };
    const names = fit ? fit.parameterNames : Object.keys(expected);
    const stdErr = names.map((k) => {
      const fitted = fit ? fit.params[k].stdErr : null;
      const planned = typeof expected[k] === 'number' ? expected[k] : null;
      return { name: k, fitted, planned, ratio: fitted !== null && planned ? fitted / planned : null };
    });
    const next: SessionClosing['nextRun'] = fit ? fit.nextRun : { ok: false, reason: `no fit: ${reason}` };
    const summary: string[] = [];
    if (fit) {
      summary.push(`${modelLabel(st.model)} fitted to ${trials.length} trials: ${fit.parameterNames.map((k) => `${k} = ${f2(fit!.params[k].value)} ± ${f2(fit!.params[k].stdErr)}`).join(', ')} (residual SD ${fit.residualSD.toFixed(2)} K).`);
      for (const e of stdErr) if (e.ratio !== null) summary.push(`${e.name}: standard error ${e.ratio <= 1.25 ? 'as planned' : `${e.ratio.toFixed(1)} × what the plan expected`} (${f2(e.fitted!)} against ${f2(e.planned!)}).`);
    } else summary.push(`No fit: ${reason}.`);
    summary.push(lackOfFit.verdict, drift.message);
    if (next.ok) summary.push(`Next best run: ${(next.flowM3PerS * 60000).toFixed(1)} L/min, to pin down ${next.targetParameter} (relative standard error ${(next.relativeStdErrNow * 100).toFixed(1)} % → ${(next.relativeStdErrAfter * 100).toFixed(1)} %).`);
    const closing: SessionClosing = {
      closedAt: new Date().toISOString(), trials: trials.length,
      runsDone: s.runs.filter((r) => r.state === 'done').length, runsSkipped: s.runs.filter((r) => r.state === 'skipped').length,
      fit: fit
        ? { ok: true, model: st.model, label: modelLabel(st.model), params: fit.params, residualSD: fit.residualSD, r2: fit.r2, df: fit.df }
        : { ok: false, reason },
      lackOfFit, drift, stdErr, nextRun: next, summary,
    };
    s.closing = JSON.parse(JSON.stringify(closing)) as Record<string, unknown>;
    s.state = 'closed';
    s.closedAt = new Date();
    await tx.flush();
    return s;
  });
}

/**
 * One click from a closed session to a study: a saved fit of the session's trials (the plan's
 * model, saveFit) and a study with the session's summary, the fit, its trials, the logger's sensor
 * log when there is one, and the cautions. Asking again returns the same study.
 * @throws DomainError conflict when the session is not closed or has no fit
 */
export async function studyFromSession(em: EntityManager, s: TestSessionRow, user: UserRow) {
  if (s.study) return s.study;
  if (s.state !== 'closed') throw conflict('Close the session first: the study starts from its verdict.', 'session_open');
  const closing = s.closing as unknown as SessionClosing;
  if (!closing.fit.ok) throw conflict(`The session has no fit to show (${closing.fit.reason}).`, 'no_fit');
  const trials = (await em.find(Trial, { session: s, excluded: false }, { orderBy: { startedAt: 'asc', id: 'asc' } })).map((t) => t.id);
  const fit = await saveFit(em, s.rig, user, {
    title: `Session: ${s.title}`.slice(0, 160), model: s.settings.model, trialIds: trials, compareWith: [], measurementSdK: s.settings.measurementUK, planInletC: Math.min(99, Math.max(0, s.settings.inletTempC)),
  });
  const study = newStudy(em, s.lab, user, `Test session: ${s.title}`.slice(0, 160));
  const md = [`## ${s.title}`, '', `A test session of ${closing.trials} trials (${closing.runsDone} runs done, ${closing.runsSkipped} skipped), planned for the ${modelLabel(s.settings.model)} model.`, '', ...closing.summary.map((x) => `- ${x}`)].join('\n');
  const id = () => randomUUID().slice(0, 8);
  const blocks: StudyBlock[] = [
    { id: id(), kind: 'text', data: { markdown: md } },
    { id: id(), kind: 'fit', data: { fitId: fit.id } },
    { id: id(), kind: 'trials', data: { fitId: fit.id } },
    ...(s.sourceFile ? [{ id: id(), kind: 'sensor-log' as const, data: { sourceFileId: s.sourceFile.id } }] : []),
    { id: id(), kind: 'caution', data: {} },
  ];
  study.blocks = blocks;
  s.study = study as never;
  await em.flush();
  return study;
}

