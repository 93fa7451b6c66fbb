/**
 * The numbers of a fit, shared by the live fit page (client) and the saved-fit page (server):
 * parameters with errors and intervals, statistics and diagnostic flags, the model comparison
 * and its verdict, the recommended and minimum flows, the performance table and cautions.
 * Plain components without hooks, so both sides can render them.
 */
import type { ChoiceView, ComparisonView, FitView, PerformanceView } from '@/app/_contracts/fit-report';
import { TempValue } from './safety-notice';
import { displayUnits } from '@/app/_contracts/units';
import type { UnitSystem } from '@/analysis/units/unit-system';

type Num = number | null | undefined;
const f = (v: Num, d = 3) => (v == null || !Number.isFinite(v) ? '—' : Math.abs(v) >= 1e5 || (Math.abs(v) < 1e-3 && v !== 0) ? v.toExponential(d) : v.toFixed(d));
/** Heat in kW (2 decimals) or Btu/h (whole). */
const kw = (w: number, u: UnitSystem) => `${f(displayUnits(u).power.from(w), u === 'us' ? 0 : 2)} ${displayUnits(u).power.label}`;

const PARAM_UNITS: Record<string, string> = { Ts: '°C', UA: 'W/K', Tinf: '°C', A: 'K', k: 's/m³' };

export function ParameterTable({ fit }: { fit: FitView }) {
  // parameters the data cannot determine: their standard errors and intervals mean nothing
  const unknown = fit.warnings.filter((w) => w.code === 'not-identifiable');
  const undetermined = new Set(unknown.map((w) => w.parameter).filter(Boolean));
  return (
    <div className="relative overflow-x-auto" tabIndex={0}>
      {unknown.length ? (
        <div role="note" className="mb-2 rounded-lg border border-danger-line bg-danger-bg px-3 py-2 text-sm text-danger-text">
          <p className="font-semibold">These trials cannot determine every parameter.</p>
          <ul className="mt-1 list-disc pl-5">
            {unknown.map((w) => (
              <li key={w.message}>{w.message}</li>
            ))}
          </ul>
          <p className="mt-1">Test at more different flows (low flows pin the source temperature, high flows the conductance) before relying on them.</p>
        </div>
      ) : null}
      <table className="data-table">
        <caption className="px-3 py-2 text-left text-sm font-semibold text-ink">{fit.label}: parameters ({Math.round(fit.level * 100)} % intervals)</caption>
        <thead>
          <tr>
            <th scope="col">Parameter</th>
            <th scope="col" className="text-right">Estimate</th>
            <th scope="col" className="text-right">Std. error</th>
            <th scope="col" className="text-right">Interval</th>
          </tr>
        </thead>
        <tbody>
          {fit.parameterNames.map((p) => {
            const e = fit.params[p];
            return (
              <tr key={p}>
                <th scope="row" className="bg-white font-normal">
                  <span className="num">{p}</span> <span className="text-xs text-ink-muted">{PARAM_UNITS[p] ?? ''}</span>
                  {e.atBound ? <span className="ml-1 text-xs text-caution-text">at {e.atBound} bound</span> : null}
                </th>
                <td className="num text-right">{f(e.value, 4)}</td>
                {undetermined.has(p) ? (
                  <>
                    <td className="num text-right text-danger-text">—</td>
                    <td className="text-right text-sm text-danger-text">not determined by these data</td>
                  </>
                ) : (
                  <>
                    <td className="num text-right">{f(e.stdErr, 3)}</td>
                    <td className="num text-right">
                      {f(e.ciLow, 4)} … {f(e.ciHigh, 4)}
                    </td>
                  </>
                )}
              </tr>
            );
          })}
        </tbody>
      </table>
      {fit.parameterNames.length > 1 ? (
        <p className="px-3 py-2 text-xs text-ink-muted">
          Correlation {fit.parameterNames[0]}–{fit.parameterNames[1]}: <span className="num">{f(fit.correlation[0]?.[1], 3)}</span>
        </p>
      ) : null}
    </div>
  );
}

export function FitStats({ fit, units }: { fit: FitView; units: UnitSystem }) {
  const rows: [string, string][] = [
    ['Trials (n) / degrees of freedom', `${fit.n} / ${fit.df}`],
    [`Residual SD (${displayUnits(units).tempDiff.label})`, f(displayUnits(units).tempDiff.from(fit.residualSD), 3)],
    ['R² / adjusted R²', `${f(fit.r2, 5)} / ${f(fit.adjustedR2, 5)}`],
    ['RSS (K²)', f(fit.rss, 4)],
    ['AICc / BIC', `${f(fit.aicc, 2)} / ${f(fit.bic, 2)}`],
    ['Iterations, stop', `${fit.iterations}, ${fit.stoppingReason}`],
    ['Flags: leverage > 2p/n, Cook’s D > 4/n, |t| > 3', `${fit.flags.highLeverage.length}, ${fit.flags.influential.length}, ${fit.flags.outliers.length}`],
  ];
  if (fit.lackOfFit) rows.push(['Lack of fit (replicates)', fit.lackOfFit.ok ? `F = ${f(fit.lackOfFit.F, 2)}, p = ${f(fit.lackOfFit.pValue, 3)}` : (fit.lackOfFit.reason ?? '—')]);
  return (
    <div>
      <dl className="grid grid-cols-1 gap-x-6 gap-y-1 text-sm sm:grid-cols-2">
        {rows.map(([k, v]) => (
          <div key={k} className="flex justify-between gap-3 border-b border-paper-line py-1">
            <dt className="text-ink-soft">{k}</dt>
            <dd className="num text-right text-ink">{v}</dd>
          </div>
        ))}
      </dl>
      {fit.lackOfFit?.ok && fit.lackOfFit.verdict ? <p className="mt-2 text-sm text-ink-soft">{fit.lackOfFit.verdict}</p> : null}
      {fit.warnings.length ? (
        <ul className="mt-3 space-y-1">
          {fit.warnings.map((w) => (
            <li key={w.code + w.message} className="rounded-lg border border-caution-line bg-caution-bg px-3 py-1.5 text-sm text-caution-text">
              {w.message}
            </li>
          ))}
        </ul>
      ) : null}
    </div>
  );
}

export function ComparisonTable({ comparison, units }: { comparison: ComparisonView; units: UnitSystem }) {
  return (
    <div>
      <p className="mb-3 rounded-lg bg-paper-deep px-3 py-2 text-sm text-ink" role="note">
        {comparison.verdict}
      </p>
      <div className="relative overflow-x-auto" tabIndex={0}>
        <table className="data-table">
          <thead>
            <tr>
              <th scope="col">Model</th>
              <th scope="col" className="text-right">ΔAICc</th>
              <th scope="col" className="text-right">Weight</th>
              <th scope="col" className="text-right">Residual SD ({displayUnits(units).tempDiff.label})</th>
              <th scope="col" className="text-right">SD / measurement u</th>
              <th scope="col">Residuals</th>
            </tr>
          </thead>
          <tbody>
            {comparison.ranking.map((r) => (
              <tr key={r.label}>
                <th scope="row" className="bg-white font-normal">
                  {r.label}
                  {!r.ok ? <span className="block text-xs text-danger-text">{r.reason}</span> : null}
                </th>
                <td className="num text-right">{f(r.deltaAicc, 1)}</td>
                <td className="num text-right">{f(r.akaikeWeight, 3)}</td>
                <td className="num text-right">{r.residualSD == null ? '—' : f(displayUnits(units).tempDiff.from(r.residualSD), 3)}</td>
                <td className="num text-right">{f(r.sdRatio, 2)}</td>
                <td>{r.ok ? (r.patterned ? <span className="text-caution-text">patterned (runs test)</span> : <span className="text-ok-text">random</span>) : '—'}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </div>
  );
}

export function FlowChoice({ choice, units }: { choice: ChoiceView; units: UnitSystem }) {
  const q = (v: number | null) => (v == null ? 'none in range' : v === 0 ? 'any flow' : `${f(displayUnits(units).flow.from(v), 2)} ${displayUnits(units).flow.label}`);
  return (
    <div className="space-y-3 text-sm">
      <p>
        For an inlet of <span className="num"><TempValue tempC={choice.inletTempC} units={units} withUnit /></span>:
      </p>
      {choice.ceiling ? (
        <p className="rounded-lg bg-ember-50 px-3 py-2 text-ink">
          <strong>Recommended flow: {q(choice.ceiling.flowM3PerS)}</strong>
          {choice.ceiling.flowU ? <span className="num"> ± {f(displayUnits(units).flow.from(choice.ceiling.flowU), 2)}</span> : null} — where delivered heat reaches{' '}
          {Math.round(choice.ceiling.fraction * 100)} % of its ceiling of {kw(choice.ceiling.heatCeilingW, units)}.
          {choice.ceiling.extrapolated ? ' This lies outside the tested flows.' : ''}
        </p>
      ) : null}
      <p className="text-ink-soft">
        {choice.optimum ? (
          <>
            Heat maximum at <span className="num">{q(choice.optimum.flowM3PerS)}</span> ({kw(choice.optimum.heatW, units)}).{' '}
          </>
        ) : null}
        {choice.optimumNote}
      </p>
      <table className="data-table">
        <caption className="py-1 text-left font-semibold text-ink">Minimum flow to keep the outlet below</caption>
        <thead>
          <tr>
            <th scope="col">Limit</th>
            <th scope="col" className="text-right">Best estimate</th>
            <th scope="col" className="text-right">With prediction margin</th>
          </tr>
        </thead>
        <tbody>
          {choice.minimumFlows.map((m) => (
            <tr key={m.label}>
              <th scope="row" className="bg-white font-normal">
                {m.label} <span className="num text-xs text-ink-muted">{f(displayUnits(units).temp.from(m.limitC), 0)} {displayUnits(units).temp.label}</span>
              </th>
              <td className="num text-right">{q(m.flowM3PerS)}</td>
              <td className="num text-right">{q(m.conservativeFlowM3PerS)}</td>
            </tr>
          ))}
        </tbody>
      </table>
      {choice.notes.map((n) => (
        <p key={n} className="text-ink-muted">{n}</p>
      ))}
    </div>
  );
}

export function PerformanceTableView({ table, units }: { table: PerformanceView; units: UnitSystem }) {
  return (
    <div className="relative overflow-x-auto" tabIndex={0}>
      <table className="data-table">
        <caption className="py-1 text-left text-sm font-semibold text-ink">
          Performance at an inlet of <TempValue tempC={table.inletTempC} units={units} withUnit /> (95 % prediction intervals)
        </caption>
        <thead>
          <tr>
            <th scope="col" className="text-right">Flow ({displayUnits(units).flow.label})</th>
            <th scope="col" className="text-right">Outlet ({displayUnits(units).temp.label})</th>
            <th scope="col" className="text-right">ΔT ({displayUnits(units).tempDiff.label})</th>
            <th scope="col" className="text-right">Heat</th>
            <th scope="col"></th>
          </tr>
        </thead>
        <tbody>
          {table.rows.map((r) => (
            <tr key={r.flowM3PerS} className={r.extrapolated ? 'text-ink-muted' : ''}>
              <td className="num text-right">{f(displayUnits(units).flow.from(r.flowM3PerS), 2)}</td>
              <td className="num text-right">
                <TempValue tempC={r.outletTempC} units={units} /> <span className="text-xs">({f(displayUnits(units).temp.from(r.outletPiC[0]), 1)}–{f(displayUnits(units).temp.from(r.outletPiC[1]), 1)})</span>
              </td>
              <td className="num text-right">{f(displayUnits(units).tempDiff.from(r.deltaTK), 1)}</td>
              <td className="num text-right">{kw(r.heatW, units)}</td>
              <td className="text-xs">{r.extrapolated ? 'extrapolated' : ''}</td>
            </tr>
          ))}
        </tbody>
      </table>
      {table.notes.map((n) => (
        <p key={n} className="mt-2 text-sm text-ink-muted">{n}</p>
      ))}
    </div>
  );
}
