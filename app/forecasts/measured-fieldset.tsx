import type { UnitSystem } from '@/analysis/units/unit-system';
import { displayUnits } from '@/app/_contracts/units';
import { NumberField } from './forecast-fields';

/**
 * A measured day (optional): what actually happened, against the forecast run from the measured
 * start with the hours the heater ran and, when chosen, the day's hourly weather table.
 */
export function MeasuredFieldset({ units }: { units: UnitSystem }) {
  const u = displayUnits(units);
  return (
    <fieldset className="card space-y-3 p-4">
      <legend className="px-1 font-semibold">A measured day (optional)</legend>
      <p className="text-xs text-ink-muted">
        Set Start to the pool&apos;s measured start, Hours to the length of the day, the heater hours to the hours it ran, and (for the day&apos;s weather) an hourly table above; then give the measured end.
      </p>
      <NumberField name="measuredEnd" label="Measured end" def="" unit={u.temp.label} />
      <div className="grid grid-cols-2 gap-3">
        <NumberField name="thermometerU" label="Thermometer ±" def={units === 'us' ? '0.5' : '0.3'} unit={`${u.tempDiff.label}, 1 SD`} />
        <NumberField name="volumeU" label="Volume ±" def="5" unit="%, 1 SD" />
      </div>
    </fieldset>
  );
}
