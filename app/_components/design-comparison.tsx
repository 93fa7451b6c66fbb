/**
 * A design comparison on the page, in a study block and on the share view: the verdict in words,
 * the overlaid plots, the parameters side by side, each design against the reference with its
 * intervals (delta method, and the bootstrap check beside it), the heat at the common conditions
 * (per metre of tube, per m² of collector and per unit of build cost where recorded) and at the
 * common flows. A plain component without hooks, so server and client parents can render it.
 */
import Link from 'next/link';
import type { DesignComparisonView, IntervalView } from '@/app/_contracts/design-comparison';
import { displayUnit, displayUnits, fmt, withUnit } from '@/app/_contracts/units';
import type { UnitSystem } from '@/analysis/units/unit-system';
import { PlotFigure } from './plot-figure';
import { TempValue } from './safety-notice';

const PARAM_UNITS: Record<string, string> = { Ts: '°C', UA: 'W/K' };

function Interval({ i, digits = 3, scale = (v: number) => v }: { i: IntervalView; digits?: number; scale?: (v: number) => number }) {
  return (
    <>
      <td className="num text-right">{fmt(scale(i.value), digits)}</td>
      <td className="num text-right">
        {fmt(scale(i.ciLow), digits)} to {fmt(scale(i.ciHigh), digits)}
      </td>
      <td className="num text-right text-ink-soft">{i.bootstrap ? `${fmt(scale(i.bootstrap.ciLow), digits)} to ${fmt(scale(i.bootstrap.ciHigh), digits)}` : '—'}</td>
    </>
  );
}

export function DesignComparison({ view: v, units, links = true, filename = 'comparison' }: { view: DesignComparisonView; units: UnitSystem; links?: boolean; filename?: string }) {
  const u = displayUnits(units);
  const power = (w: number) => withUnit(w, u.power);
  const pct = Math.round(v.level * 100);
  const at = `${withUnit(v.inletTempC, u.temp)} inlet and ${withUnit(v.flowM3PerS, u.flow)}`;
  const anyTube = v.designs.some((d) => d.heatPerMetreW !== null);
  const anyArea = v.designs.some((d) => d.heatPerM2W !== null);
  const anyCost = v.designs.some((d) => d.heatPerCostW !== null);
  const length = displayUnit('length', units), area = displayUnit('area', units), conductance = displayUnit('conductance', units);
  return (
    <div className="space-y-6">
      <section className="card space-y-2 border-l-4 border-l-ember-500 p-4" aria-label="Verdict">
        <h2 className="text-lg">Verdict</h2>
        {v.pairs.map((p) => (
          <p key={p.keys.join('-')} className="text-ink">
            {p.verdict}
          </p>
        ))}
        <p className="text-sm text-ink-soft">
          Compared at a common {at}, with {pct} % intervals from each fit&apos;s covariance (delta method) and a paired residual bootstrap as a check. A difference is claimed
          only when its interval leaves out zero.
        </p>
        {v.problems.length ? (
          <ul className="list-disc pl-5 text-sm text-danger-text">
            {v.problems.map((p) => (
              <li key={p}>{p}</li>
            ))}
          </ul>
        ) : null}
      </section>
      <div className="grid gap-4 2xl:grid-cols-2">
        <PlotFigure {...v.plots.outlet} filename={`${filename}-outlet`} />
        <PlotFigure {...v.plots.heat} filename={`${filename}-heat`} />
      </div>
      <section className="card relative overflow-x-auto p-4">
        <table className="data-table">
          <caption className="px-3 py-2 text-left text-sm font-semibold text-ink">The designs side by side ({pct} % intervals)</caption>
          <thead>
            <tr>
              <th scope="col">Design</th>
              <th scope="col">Model</th>
              <th scope="col" className="text-right">Trials</th>
              <th scope="col">Parameters</th>
              <th scope="col" className="text-right">Heat at the common conditions</th>
              {anyTube ? <th scope="col" className="text-right">per {length.label} of tube</th> : null}
              {anyArea ? <th scope="col" className="text-right">per {area.label} of collector</th> : null}
              {anyCost ? <th scope="col" className="text-right">per unit of build cost</th> : null}
            </tr>
          </thead>
          <tbody>
            {v.designs.map((d) => (
              <tr key={d.key}>
                <th scope="row" className="bg-white font-normal">
                  <span className="font-semibold">{d.key}</span>{' '}
                  {links && d.id ? <Link href={d.kind === 'fit' ? `/fits/${d.id}` : `/rigs/${d.id}`}>{d.label}</Link> : d.label}
                  {d.kind === 'fit' ? <span className="block text-xs text-ink-muted">saved fit on {d.rigName}</span> : null}
                </th>
                <td className="text-sm">{d.modelLabel}</td>
                <td className="num text-right">{d.n}</td>
                <td className="text-sm">
                  {d.params.map((p) => (
                    <span key={p.name} className="block whitespace-nowrap">
                      <span className="num">{p.name}</span> ={' '}
                      {p.name === 'Ts' ? (
                        <>
                          <TempValue tempC={p.value} units={units} withUnit /> <span className="num text-ink-muted">({withUnit(p.ciLow, u.temp)} to {withUnit(p.ciHigh, u.temp)})</span>
                        </>
                      ) : p.name === 'UA' ? (
                        <span className="num">
                          {withUnit(p.value, conductance)} <span className="text-ink-muted">({fmt(conductance.from(p.ciLow))} to {fmt(conductance.from(p.ciHigh))})</span>
                        </span>
                      ) : (
                        <span className="num">
                          {fmt(p.value, 4)} {PARAM_UNITS[p.name] ?? ''} <span className="text-ink-muted">({fmt(p.ciLow, 4)} to {fmt(p.ciHigh, 4)})</span>
                        </span>
                      )}
                    </span>
                  ))}
                </td>
                <td className="num text-right">
                  {power(d.heatW.value)}
                  <span className="block text-xs text-ink-muted">
                    {fmt(u.power.from(d.heatW.ciLow))} to {fmt(u.power.from(d.heatW.ciHigh))}
                  </span>
                </td>
                {anyTube ? <td className="num text-right">{d.heatPerMetreW !== null && d.tubeLengthM ? `${fmt(u.power.from(d.heatW.value) / length.from(d.tubeLengthM))} ${u.power.label}/${length.label}` : '—'}</td> : null}
                {anyArea ? <td className="num text-right">{d.heatPerM2W !== null && d.collectorAreaM2 ? `${fmt(u.power.from(d.heatW.value) / area.from(d.collectorAreaM2))} ${u.power.label}/${area.label}` : '—'}</td> : null}
                {anyCost ? <td className="num text-right">{d.heatPerCostW !== null && d.buildCost ? `${fmt(u.power.from(d.heatW.value) / d.buildCost.amount)} ${u.power.label} per ${d.buildCost.currency}` : '—'}</td> : null}
              </tr>
            ))}
          </tbody>
        </table>
      </section>
      <section className="card relative overflow-x-auto p-4">
        <table className="data-table">
          <caption className="px-3 py-2 text-left text-sm font-semibold text-ink">Each design against {v.designs[0].key} ({pct} % intervals)</caption>
          <thead>
            <tr>
              <th scope="col">Designs</th>
              <th scope="col">Quantity</th>
              <th scope="col" className="text-right">Estimate</th>
              <th scope="col" className="text-right">Delta method</th>
              <th scope="col" className="text-right">Bootstrap check</th>
            </tr>
          </thead>
          <tbody>
            {v.pairs.flatMap((p) => {
              const who = `${p.keys[1]} against ${p.keys[0]}`;
              return [
                p.uaRatio ? (
                  <tr key={`${who}-ua`}>
                    <th scope="row" className="bg-white font-normal">{who}</th>
                    <td>UA ratio</td>
                    <Interval i={p.uaRatio} />
                  </tr>
                ) : null,
                p.tsDifferenceK ? (
                  <tr key={`${who}-ts`}>
                    <th scope="row" className="bg-white font-normal">{who}</th>
                    <td>Ts difference ({u.tempDiff.label})</td>
                    <Interval i={p.tsDifferenceK} scale={(k) => k * u.tempDiff.factor} />
                  </tr>
                ) : null,
                <tr key={`${who}-q`}>
                  <th scope="row" className="bg-white font-normal">{who}</th>
                  <td>Heat difference at the common conditions (%)</td>
                  <Interval i={p.heatDifferencePercent} />
                </tr>,
              ];
            })}
          </tbody>
        </table>
        <ul className="mt-3 list-disc space-y-1 pl-5 text-sm text-ink-soft">
          {[...v.pairs.flatMap((p) => p.notes), ...v.notes].filter((n, i, all) => all.indexOf(n) === i).map((n) => (
            <li key={n}>{n}</li>
          ))}
        </ul>
      </section>
      <section className="card relative overflow-x-auto p-4">
        <table className="data-table">
          <caption className="px-3 py-2 text-left text-sm font-semibold text-ink">Heat delivered at {withUnit(v.inletTempC, u.temp)} inlet and common flows</caption>
          <thead>
            <tr>
              <th scope="col" className="text-right">Flow ({u.flow.label})</th>
              {v.designs.map((d) => (
                <th key={d.key} scope="col" className="text-right">
                  {d.key} ({u.power.label})
                </th>
              ))}
              <th scope="col">Note</th>
            </tr>
          </thead>
          <tbody>
            {v.heatTable.map((h) => (
              <tr key={h.flowM3PerS}>
                <td className="num text-right">{fmt(u.flow.from(h.flowM3PerS))}</td>
                {h.heatW.map((q, i) => (
                  <td key={i} className="num text-right">
                    {q === null ? '—' : fmt(u.power.from(q))}
                  </td>
                ))}
                <td className="text-sm text-ink-muted">{h.extrapolated ? 'extrapolated for at least one design' : ''}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </section>
    </div>
  );
}
