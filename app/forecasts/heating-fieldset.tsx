import { HourSelect, NumberField } from './forecast-fields';
import type { UnitSystem } from '@/analysis/units/unit-system';
import { displayUnits } from '@/app/_contracts/units';

/** Heating: start and target, hours, pump flow, thermostat, heater schedule, and the heater (a saved coil or collector fit, or Ts and UA). */
export function HeatingFieldset({ units, fits }: { units: UnitSystem; fits: { id: string; label: string }[] }) {
  const us = units === 'us';
  const u = displayUnits(units);
  return (
    <fieldset className="card space-y-3 p-4">
      <legend className="px-1 font-semibold">Heating</legend>
      <div className="grid grid-cols-2 gap-3">
        <NumberField name="startTemp" label="Start" def={us ? '68' : '20'} unit={u.temp.label} />
        <NumberField name="targetTemp" label="Target" def={us ? '82' : '28'} unit={u.temp.label} />
        <NumberField name="hours" label="Hours" def="48" unit="h" />
        <NumberField name="flow" label="Pump flow" def={us ? '3' : '12'} unit={u.flow.label} />
      </div>
      <label className="flex items-center gap-2 text-sm">
        <input type="checkbox" name="thermostat" defaultChecked /> stop heating at the target (thermostat)
      </label>
      <div className="grid grid-cols-3 gap-3 text-sm">
        <HourSelect name="startHour" label="Starts at" def={8} fullName="Forecast starts at" />
        <HourSelect name="heaterFrom" label="Heater on" def={0} fullName="Heater on at" />
        <HourSelect name="heaterTo" label="off" def={0} fullName="Heater off at" />
      </div>
      <p className="text-xs text-ink-muted">The same on and off hours are all day. The pump runs while the heater does.</p>
      <label className="block">
        <span className="field-label">Heater</span>
        <select name="fitId" aria-label="Heater" className="field-input" defaultValue={fits[0]?.id ?? ''}>
          {fits.map((x) => (
            <option key={x.id} value={x.id}>
              {x.label}
            </option>
          ))}
          <option value="">Enter Ts and UA</option>
        </select>
      </label>
      <div className="grid grid-cols-2 gap-3">
        <NumberField name="ts" label="Source Ts" def={us ? '190' : '88'} unit={u.temp.label} />
        <NumberField name="ua" label="UA" def="430" unit="W/K" />
      </div>
      <p className="text-xs text-ink-muted">Ts and UA are used only when no saved fit is chosen.</p>
      <div className="grid grid-cols-2 gap-3">
        <NumberField name="sunIrradiance" label="Sun on a collector" def="800" unit="W/m²" />
        <NumberField name="sunAir" label="Air at the collector" def={us ? '77' : '25'} unit={u.temp.label} />
      </div>
      <p className="text-xs text-ink-muted">The sun and air are used only with a collector fit: its curve at that steady sun during the heater hours.</p>
    </fieldset>
  );
}
