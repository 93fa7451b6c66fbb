import type { CollectorViewDto } from '../_contracts/collector';
import { fmt } from '../_contracts/units';
import { PlotFigure } from './plot-figure';

const NAMES: Record<string, string> = { eta0: 'η₀', a1: 'a₁', a2: 'a₂' };

/**
 * A collector efficiency test (ISO 9806 steady-state form): the coefficients with standard errors
 * and intervals, the covariance, the statistics, the curve and residual plots, and the trials the
 * steadiness limits or missing readings left out. Renders on the server or inside a client leaf.
 */
export function CollectorReport({ view, filename = 'collector' }: { view: CollectorViewDto; filename?: string }) {
  const v = view;
  const pct = Math.round(v.level * 100);
  const rows = [
    { name: 'eta0', label: 'η₀ (zero-loss efficiency)', unit: '–', e: v.eta0, d: 4 },
    { name: 'a1', label: 'a₁ (heat-loss coefficient)', unit: 'W/(m²·K)', e: v.a1WPerM2K, d: 3 },
    { name: 'a2', label: 'a₂ (temperature dependence of a₁)', unit: 'W/(m²·K²)', e: v.a2WPerM2K2, d: 5 },
  ].filter((r) => v.parameterNames.includes(r.name));
  return (
    <div className="space-y-6">
      <section className="card space-y-3 p-4" aria-label="Efficiency coefficients">
        <h2 className="text-lg">Efficiency curve η = η₀ − a₁·x − a₂·G·x²</h2>
        <p className="text-sm text-ink-soft">
          Coefficients per <strong>{v.areaBasis} area</strong> ({fmt(v.areaM2, 3)} m²), x = (Tm − Ta)/G with Tm the mean of inlet and outlet; {v.n} steady points, {v.df} degrees of freedom,{' '}
          {v.weighted ? 'weighted by 1/u²(η)' : 'unweighted'}. The quasi-dynamic form of ISO 9806 is not covered.
        </p>
        <div className="relative overflow-x-auto" tabIndex={0}>
        <table className="data-table w-full text-sm">
          <thead>
            <tr><th scope="col">Coefficient</th><th scope="col">Value</th><th scope="col">Std. error</th><th scope="col">{pct} % interval</th><th scope="col">Unit</th></tr>
          </thead>
          <tbody>
            {rows.map((r) => (
              <tr key={r.name}>
                <th scope="row" className="text-left font-normal">{r.label}</th>
                <td className="num">{fmt(r.e.value, r.d)}</td>
                <td className="num">{fmt(r.e.stdErr, r.d)}</td>
                <td className="num">{fmt(r.e.ciLow, r.d)} … {fmt(r.e.ciHigh, r.d)}</td>
                <td>{r.unit}</td>
              </tr>
            ))}
          </tbody>
        </table>
        </div>
        <dl className="grid grid-cols-2 gap-x-4 gap-y-1 break-words text-sm sm:grid-cols-4">
          <dt className="text-ink-muted">R²</dt><dd className="num">{v.r2 === null ? '–' : fmt(v.r2, 4)}</dd>
          <dt className="text-ink-muted">Residual SD of η</dt><dd className="num">{fmt(v.residualSD, 4)}</dd>
          <dt className="text-ink-muted">Tested x</dt><dd className="num">{fmt(v.xRangeM2KPerW[0], 4)} … {fmt(v.xRangeM2KPerW[1], 4)} m²·K/W</dd>
          <dt className="text-ink-muted">Band at G</dt><dd className="num">{fmt(v.bandIrradianceWPerM2, 0)} W/m²</dd>
        </dl>
        <div className="relative overflow-x-auto" tabIndex={0}>
        <table className="data-table text-sm" aria-label="Covariance of the coefficients">
          <caption className="text-left text-ink-muted">Covariance</caption>
          <thead><tr><th scope="col"></th>{v.parameterNames.map((n) => <th key={n} scope="col">{NAMES[n] ?? n}</th>)}</tr></thead>
          <tbody>
            {v.covariance.map((row, i) => (
              <tr key={i}><th scope="row">{NAMES[v.parameterNames[i]] ?? v.parameterNames[i]}</th>{row.map((c, j) => <td key={j} className="num whitespace-nowrap">{c.toExponential(3)}</td>)}</tr>
            ))}
          </tbody>
        </table>
        </div>
        {v.warnings.length ? (
          <ul className="list-disc space-y-1 pl-5 text-sm text-caution-text" aria-label="Warnings">
            {v.warnings.map((w, i) => <li key={i}>{w}</li>)}
          </ul>
        ) : null}
      </section>
      <PlotFigure {...v.plots.curve} filename={`${filename}-efficiency`} />
      <div className="grid gap-4 lg:grid-cols-2">
        <PlotFigure {...v.plots.resX} filename={`${filename}-residuals-x`} />
        <PlotFigure {...v.plots.resOrder} filename={`${filename}-residuals-order`} />
      </div>
      <section className="card p-4" aria-label="Trials left out">
        <h2 className="text-lg">Trials left out</h2>
        {v.excluded.length === 0 && v.skipped.length === 0 ? <p className="text-sm text-ink-soft">Every trial was steady and complete.</p> : null}
        {v.excluded.length ? (
          <>
            <p className="mt-1 text-sm text-ink-soft">Outside the steadiness limits (ISO 9806 steady-state test; the permitted deviations are options of the lab):</p>
            <ul className="mt-1 list-disc pl-5 text-sm">{v.excluded.map((e, i) => <li key={i}><span className="num">{e.label}</span>: {e.reasons.join('; ')}</li>)}</ul>
          </>
        ) : null}
        {v.skipped.length ? (
          <>
            <p className="mt-2 text-sm text-ink-soft">Without the readings the test needs:</p>
            <ul className="mt-1 list-disc pl-5 text-sm">{v.skipped.map((e) => <li key={e.id}><span className="num">{e.label}</span>: {e.reason}</li>)}</ul>
          </>
        ) : null}
      </section>
      <section className="card p-4">
        <h2 className="text-lg">Points</h2>
        <div className="relative overflow-x-auto" tabIndex={0}>
          <table className="data-table w-full text-sm">
            <thead><tr><th scope="col">Trial</th><th scope="col">x (m²·K/W)</th><th scope="col">Tm (°C)</th><th scope="col">Heat (W)</th><th scope="col">η</th><th scope="col">Fitted</th><th scope="col">Residual</th></tr></thead>
            <tbody>
              {v.points.map((p, i) => (
                <tr key={i}><td className="num">{p.label}</td><td className="num">{fmt(p.xM2KPerW, 4)}</td><td className="num">{fmt(p.meanTempC, 1)}</td><td className="num">{fmt(p.heatW, 0)}</td><td className="num">{fmt(p.efficiency, 4)}</td><td className="num">{fmt(p.fitted, 4)}</td><td className="num">{fmt(p.residual, 4)}</td></tr>
              ))}
            </tbody>
          </table>
        </div>
      </section>
    </div>
  );
}
