import type { UnitSystem } from '@/analysis/units/unit-system';
import { displayUnits } from '@/app/_contracts/units';
import type { MeasuredDayView } from '../_contracts/study-blocks';
import { TempValue } from './safety-notice';

/** The measured day beside the forecast: ends, residual and the unmodelled gain with its uncertainty (k = 2), and the verdict. */
export function MeasuredDay({ day, units }: { day: MeasuredDayView; units: UnitSystem }) {
  const u = displayUnits(units);
  const kWh = (j: number) => (j / 3.6e6).toFixed(2);
  return (
    <section className="card space-y-3 p-4" aria-label="The measured day">
      <h2 className="text-lg">The measured day against the forecast</h2>
      <table className="data-table text-sm">
        <tbody>
          <tr><th scope="row">Measured start</th><td><TempValue tempC={day.startTemp_degC} units={units} withUnit /></td></tr>
          <tr><th scope="row">Forecast end</th><td><TempValue tempC={day.predictedEndTemp_degC} units={units} withUnit /></td></tr>
          <tr><th scope="row">Measured end</th><td><TempValue tempC={day.observedEndTemp_degC} units={units} withUnit /></td></tr>
          <tr><th scope="row">Residual (measured − forecast)</th><td className="num">{u.tempDiff.from(day.residual_K).toFixed(2)} ± {u.tempDiff.from(2 * day.residualU_K).toFixed(2)} {u.tempDiff.label} (k = 2)</td></tr>
          <tr><th scope="row">Gain the model did not include</th><td className="num">{kWh(day.unmodelledGain_J)} ± {kWh(2 * day.unmodelledGainU_J)} kWh; {day.unmodelledGain_W.toFixed(0)} ± {(2 * day.unmodelledGainU_W).toFixed(0)} W{day.unmodelledGain_W_per_m2 === null ? '' : `; ${day.unmodelledGain_W_per_m2.toFixed(1)} W/m² of surface`}</td></tr>
        </tbody>
      </table>
      <p className={day.significant ? 'font-medium text-ink' : 'text-ink-soft'}>{day.verdict}</p>
    </section>
  );
}
