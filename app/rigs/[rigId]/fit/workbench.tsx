'use client';

import { useRouter } from 'next/navigation';
import { useEffect, useMemo, useRef, useState } from 'react';
import { api, ApiError } from '../../../_components/api';
import { ComparisonTable, FitStats, FlowChoice, ParameterTable, PerformanceTableView } from '../../../_components/fit-report';
import { PlotFigure } from '../../../_components/plot-figure';
import { CautionList } from '../../../_components/safety-notice';
import { displayUnits } from '@/app/_contracts/units';
import type { UnitSystem } from '@/analysis/units/unit-system';
import type { AnalyzeResponse } from '../../../_contracts/analyze';
import { fitCurvePlot, heatPlot, residualPlots, type PlotFigure as Figure } from '../../../_plots';
import { MODEL_CHOICES } from '../../../_contracts/models';

type Analysis = AnalyzeResponse;

const MODELS = MODEL_CHOICES;

/** Answers kept for going back to a model set or an inlet tried a moment ago (a toggle back redraws at once). */
const KEPT_ANSWERS = 24;

/** The page's figures, built in the browser from the numbers of the answer (app/_plots, the same builders as the server's SVG). */
function figuresOf(r: Analysis | null, units: UnitSystem): Record<string, Figure> {
  if (!r?.plots) return {};
  const res = residualPlots(r.plots.residuals, units);
  return { curve: fitCurvePlot(r.plots.curve, units), heat: heatPlot(r.plots.heat, units), resFlow: res.vsFlow, resFitted: res.vsFitted, resOrder: res.vsOrder, qq: res.qq };
}

/** Fit and compare models live on a rig's included trials; save the chosen fit as a record. */
export function FitWorkbench({ rigId, rigName, labId, units, canSave }: { rigId: string; rigName: string; labId: string; units: UnitSystem; canSave: boolean }) {
  const router = useRouter();
  const [models, setModels] = useState<string[]>(['coil', 'exp-inlet']);
  const [inlet, setInlet] = useState<string>('');
  const [result, setResult] = useState<Analysis | null>(null);
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const [title, setTitle] = useState(`${rigName} — coil fit`);
  const [primary, setPrimary] = useState('coil');
  const [saveError, setSaveError] = useState<string | null>(null);
  const answers = useRef(new Map<string, Analysis>());

  useEffect(() => {
    if (!models.length) return;
    const planInletC = inlet.trim() ? displayUnits(units).temp.to(Number(inlet.replace(',', '.'))) : undefined;
    if (planInletC !== undefined && !Number.isFinite(planInletC)) return;
    const body = { models, ...(planInletC !== undefined ? { planInletC } : {}) };
    const key = JSON.stringify(body);
    const kept = answers.current.get(key);
    if (kept) {
      // the same question a moment ago (the trials are the rig's; a new page load asks again)
      setResult(kept);
      setError(null);
      setBusy(false);
      return;
    }
    let live = true;
    // the analysis is fetched here, so its busy flag is set here (SWR would hide the request the page shows as busy)
    setBusy(true);
    api<Analysis>(`/api/rigs/${rigId}/analyze`, { body })
      .then((r) => {
        answers.current.set(key, r);
        if (answers.current.size > KEPT_ANSWERS) answers.current.delete(answers.current.keys().next().value as string);
        if (!live) return;
        setResult(r);
        setError(null);
        if (!inlet) setInlet(displayUnits(units).temp.from(r.planInletC).toFixed(1));
      })
      .catch((e) => live && setError(e instanceof ApiError ? e.message : 'The server could not be reached.'))
      .finally(() => live && setBusy(false));
    return () => {
      live = false;
    };
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [models.join(','), inlet, rigId]);

  const fitsOk = result?.fits ?? [];
  const first = fitsOk[0];
  const figures = useMemo(() => figuresOf(result, units), [result, units]);
  const figure = (k: string, filename: string) => {
    const f = figures[k];
    return f ? <PlotFigure key={k} title={f.title} summary={f.summary} cautions={f.cautions} options={f.options} filename={filename} /> : null;
  };

  async function save() {
    setSaveError(null);
    try {
      const planInletC = inlet.trim() ? displayUnits(units).temp.to(Number(inlet)) : undefined;
      const r = await api<{ fit: { id: string } }>(`/api/labs/${labId}/fits`, {
        body: { rigId, title, model: primary, trialIds: result?.trialIds, compareWith: models.filter((m) => m !== primary), ...(planInletC !== undefined ? { planInletC } : {}) },
      });
      router.push(`/fits/${r.fit.id}`);
    } catch (e) {
      setSaveError(e instanceof ApiError ? e.message : 'The server could not be reached.');
    }
  }

  return (
    <div className="grid gap-6 lg:grid-cols-[17rem_1fr]">
      <aside className="space-y-5">
        <fieldset className="card space-y-2 p-4">
          <legend className="px-1 font-semibold">Models</legend>
          {MODELS.map((m) => (
            <label key={m.id} className="flex items-start gap-2 text-sm">
              <input
                type="checkbox"
                className="mt-1"
                checked={models.includes(m.id)}
                onChange={(e) => setModels(e.target.checked ? [...models, m.id] : models.filter((x) => x !== m.id))}
              />
              {m.label}
            </label>
          ))}
        </fieldset>
        <label className="card block p-4">
          <span className="field-label">Plan for an inlet of ({displayUnits(units).temp.label})</span>
          <input className="field-input num" inputMode="decimal" value={inlet} onChange={(e) => setInlet(e.target.value)} />
          <span className="mt-1 block text-xs text-ink-muted">Used for the heat curve, the flow choice and the performance table.</span>
        </label>
        {canSave && first ? (
          <section className="card space-y-3 p-4" aria-labelledby="save-h">
            <h2 id="save-h" className="font-semibold">Save a fit</h2>
            <label className="block">
              <span className="field-label">Title</span>
              <input className="field-input" value={title} onChange={(e) => setTitle(e.target.value)} />
            </label>
            <label className="block">
              <span className="field-label">Model to save</span>
              <select className="field-input" value={primary} onChange={(e) => setPrimary(e.target.value)}>
                {fitsOk.map((f) => (
                  <option key={f.model} value={f.model}>
                    {f.label}
                  </option>
                ))}
              </select>
            </label>
            <p className="text-xs text-ink-muted">The saved fit records these {result?.n} trials and cannot change; refitting makes a new version.</p>
            {saveError ? <p role="alert" className="text-sm text-danger-text">{saveError}</p> : null}
            <button type="button" className="btn-primary w-full" onClick={save}>
              Save fit
            </button>
          </section>
        ) : null}
      </aside>
      <div className="min-w-0 space-y-6" aria-busy={busy}>
        {error ? <p role="alert" className="rounded-lg border border-danger-line bg-danger-bg px-3 py-2 text-danger-text">{error}</p> : null}
        {!result && !error ? <p role="status" className="text-ink-muted">Fitting…</p> : null}
        {result ? (
          <>
            <p className="text-sm text-ink-muted">
              {result.n} included trials. Excluded trials are drawn hollow and not fitted; change them on the rig page.
            </p>
            {figure('curve', 'outlet-vs-flow')}
            <section className="card p-4" aria-labelledby="cmp-h">
              <h2 id="cmp-h" className="mb-3 text-lg">Model comparison</h2>
              <ComparisonTable comparison={result.comparison} units={units} />
            </section>
            {first ? (
              <section className="card space-y-4 p-4" aria-labelledby="best-h">
                <h2 id="best-h" className="text-lg">{first.label}</h2>
                <ParameterTable fit={first} />
                <FitStats fit={first} units={units} />
              </section>
            ) : null}
            <section aria-labelledby="res-h">
              <h2 id="res-h" className="mb-3 text-lg">Residuals of {first?.label}</h2>
              <div className="grid gap-4 xl:grid-cols-2">
                {['resFlow', 'resFitted', 'resOrder', 'qq'].map((k) => figure(k, `residuals-${k}`))}
              </div>
            </section>
            {figure('heat', 'heat-vs-flow')}
            {result.choice ? (
              <section className="card p-4" aria-labelledby="choice-h">
                <h2 id="choice-h" className="mb-3 text-lg">Choosing a flow</h2>
                <FlowChoice choice={result.choice} units={units} />
              </section>
            ) : null}
            {result.performance ? (
              <section className="card space-y-3 p-4" aria-labelledby="perf-h">
                <h2 id="perf-h" className="text-lg">Performance table</h2>
                <PerformanceTableView table={result.performance} units={units} />
                <CautionList cautions={result.performance.cautions} />
              </section>
            ) : null}
            {fitsOk.slice(1).map((fv) => (
              <details key={fv.model} className="card p-4">
                <summary className="cursor-pointer font-semibold">{fv.label}: parameters and statistics</summary>
                <div className="mt-3 space-y-4">
                  <ParameterTable fit={fv} />
                  <FitStats fit={fv} units={units} />
                </div>
              </details>
            ))}
          </>
        ) : null}
      </div>
    </div>
  );
}
