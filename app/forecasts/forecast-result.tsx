'use client';

import { useMemo } from 'react';
import type { UnitSystem } from '@/analysis/units/unit-system';
import { displayUnit, displayUnits } from '@/app/_contracts/units';
import { energyBudgetPlot, forecastPlot, type EnergyBudgetInput, type ForecastPlotInput } from '../_plots';
import { CautionList, TempValue } from '../_components/safety-notice';
import { PlotFigure } from '../_components/plot-figure';
import { MeasuredDay } from '../_components/measured-day';
import type { MeasuredDayView, SeasonView } from '../_contracts/study-blocks';
import { SeasonResult } from '../_components/season-result';

/** What POST /api/labs/:id/forecast answers (SI; the names carry the unit). */
export interface ForecastResult {
  finalTemp_degC: number;
  maxOutletTemp_degC: number;
  hoursToTarget_h: number | null;
  equilibriumTemp_degC: number | null;
  equilibriumNote?: string;
  /** heater hours per day that hold the target under the mean weather and cover (null: cannot, or no target) */
  holdHoursPerDay_h?: number | null;
  holdNote?: string | null;
  evaporated_kg: number;
  fitNote: string | null;
  pool: { volume_m3: number; area_m2: number } | null;
  cautions: { code: string; level: string; message: string }[];
  riseTable: { flowsM3PerS: number[]; volumesM3: number[]; risePerHourK: number[][] } | null;
  cost: { perUsefulTherm: number; perDegF: number; perK: number; forecastHeatCost: number; season?: SeasonView | null } | null;
  /** the plot builders' inputs (app/_plots), reduced for display: the page draws them in the reader's units */
  plots: { trajectory: { input: ForecastPlotInput }; budget: { input: EnergyBudgetInput } };
  /** the measured day, when one was given */
  measuredDay?: MeasuredDayView | null;
}

/** A forecast's result: final temperature, hours to target, equilibrium, the pool, cautions, both plots, the cost and the rise table. */
export function ForecastResultView({ res, units }: { res: ForecastResult; units: UnitSystem }) {
  const us = units === 'us';
  const u = displayUnits(units);
  const poolVolume = displayUnit('poolVolume', units), area = displayUnit('area', units);
  // drawn here from the numbers, with the same builders as the server's SVG of a study's forecast block
  const trajectory = useMemo(() => forecastPlot(res.plots.trajectory.input, units), [res, units]);
  const budget = useMemo(() => energyBudgetPlot(res.plots.budget.input, units), [res, units]);
  return (
    <>
      <dl className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4">
        {[
          ['Final temperature', <TempValue key="f" tempC={res.finalTemp_degC} units={units} withUnit />],
          ['Hours to target', res.hoursToTarget_h == null ? 'not reached' : `${res.hoursToTarget_h.toFixed(1)} h`],
          ['Equilibrium', res.equilibriumTemp_degC == null ? '—' : <TempValue key="e" tempC={res.equilibriumTemp_degC} units={units} withUnit />],
          ['Heater hours a day to hold the target', res.holdNote == null ? 'no target' : res.holdHoursPerDay_h == null ? 'cannot hold' : `${res.holdHoursPerDay_h.toFixed(1)} h`],
        ].map(([k, val]) => (
          <div key={String(k)} className="card p-4">
            <dt className="text-sm text-ink-soft">{k}</dt>
            <dd className="num mt-1 text-2xl text-ink">{val}</dd>
          </div>
        ))}
      </dl>
      {res.equilibriumNote ? <p className="text-sm text-ink-soft">{res.equilibriumNote}</p> : null}
      {res.holdNote ? <p className="text-sm text-ink-soft">{res.holdNote}</p> : null}
      {res.fitNote ? <p className="text-sm text-ink-soft">{res.fitNote}</p> : null}
      {res.pool ? (
        <p className="text-sm text-ink-soft">
          Pool: <span className="num">{poolVolume.from(res.pool.volume_m3).toFixed(us ? 0 : 1)} {poolVolume.label}</span>, surface{' '}
          <span className="num">{area.from(res.pool.area_m2).toFixed(us ? 0 : 1)} {area.label}</span>.
        </p>
      ) : null}
      <CautionList cautions={res.cautions} />
      {res.measuredDay ? <MeasuredDay day={res.measuredDay} units={units} /> : null}
      <PlotFigure title={trajectory.title} summary={trajectory.summary} cautions={trajectory.cautions} options={trajectory.options} filename="forecast" />
      <PlotFigure title={budget.title} summary={budget.summary} options={budget.options} filename="energy-budget" />
      {res.cost ? (
        <dl className="grid gap-3 sm:grid-cols-3">
          {[
            ['Per useful therm', res.cost.perUsefulTherm.toFixed(2)],
            [`Per degree (${u.tempDiff.label})`, (us ? res.cost.perDegF : res.cost.perK).toFixed(2)],
            ['Heat of this forecast', res.cost.forecastHeatCost.toFixed(2)],
          ].map(([k, val]) => (
            <div key={k} className="card p-4">
              <dt className="text-sm text-ink-soft">{k}</dt>
              <dd className="num mt-1 text-xl text-ink">{val}</dd>
            </div>
          ))}
        </dl>
      ) : null}
      {res.cost?.season ? <SeasonResult season={res.cost.season} units={units} /> : null}
      {res.riseTable ? (
        <div className="card relative overflow-x-auto p-4" tabIndex={0}>
          <table className="data-table">
            <caption className="py-1 text-left text-sm font-semibold text-ink">Rise per hour by pump flow and pool size, at the start temperature</caption>
            <thead>
              <tr>
                <th scope="col">Flow</th>
                {res.riseTable.volumesM3.map((vol) => (
                  <th key={vol} scope="col" className="text-right">
                    {poolVolume.from(vol).toFixed(us ? 0 : 1)} {poolVolume.label}
                  </th>
                ))}
              </tr>
            </thead>
            <tbody>
              {res.riseTable.flowsM3PerS.map((q, i) => (
                <tr key={q}>
                  <th scope="row" className="num bg-white font-normal">
                    {u.flow.from(q).toFixed(1)} {u.flow.label}
                  </th>
                  {res.riseTable!.risePerHourK[i].map((r, j) => (
                    <td key={j} className="num text-right">
                      {u.tempDiff.from(r).toFixed(2)} {u.tempDiff.label}/h
                    </td>
                  ))}
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      ) : null}
    </>
  );
}
