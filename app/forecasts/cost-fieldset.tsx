import { NumberField } from './forecast-fields';

const FUEL_OPTIONS = (
  <>
    <option value="propane">Propane (price per gal)</option>
    <option value="natural-gas">Natural gas (per therm)</option>
    <option value="electric-resistance">Electric resistance (per kWh)</option>
    <option value="heat-pump">Heat pump (per kWh; efficiency = COP)</option>
    <option value="wood">Wood (per cord)</option>
  </>
);

/** The optional running cost: fuel, price per unit and efficiency (or COP); and a season with the payback of the build against a purchased heater. */
export function CostFieldset({ targetHint }: { targetHint: string }) {
  return (
    <fieldset className="card space-y-3 p-4">
      <legend className="px-1 font-semibold">Running cost (optional)</legend>
      <label className="block">
        <span className="field-label">Fuel</span>
        <select name="fuel" className="field-input" defaultValue="propane">
          {FUEL_OPTIONS}
        </select>
      </label>
      <div className="grid grid-cols-2 gap-3">
        <NumberField name="price" label="Price" def="" unit="per unit" />
        <NumberField name="efficiency" label="Efficiency" def="" unit="0–1 or COP" />
      </div>
      <p className="text-xs text-ink-muted">Heating values are higher heating values (EIA). The efficiency defaults to the fuel’s typical value.</p>
      <details className="space-y-3">
        <summary className="cursor-pointer text-sm font-semibold">A season and the payback of the build</summary>
        <p className="text-xs text-ink-muted">The pool held at a target for the season under this forecast’s weather (losses on), with the price above.</p>
        <div className="grid grid-cols-2 gap-3">
          <NumberField name="seasonDays" label="Season" def="" unit="days" />
          <NumberField name="seasonHours" label="Heater hours" def="" unit="a day" />
          <NumberField name="seasonTarget" label="Season target" def="" unit={targetHint} />
          <label className="flex items-center gap-2 self-end text-sm">
            <input type="checkbox" name="seasonCover" /> Cover on outside the heater hours
          </label>
          <NumberField name="buildPrice" label="Build cost" def="" unit="money" />
          <NumberField name="purchasedPrice" label="Purchased heater" def="" unit="price" />
        </div>
        <label className="block">
          <span className="field-label">Purchased heater’s fuel</span>
          <select name="purchasedFuel" className="field-input" defaultValue="">
            <option value="">The same fuel</option>
            {FUEL_OPTIONS}
          </select>
        </label>
        <div className="grid grid-cols-2 gap-3">
          <NumberField name="purchasedFuelPrice" label="Its fuel price" def="" unit="per unit" />
          <NumberField name="purchasedEfficiency" label="Its efficiency" def="" unit="0–1 or COP" />
        </div>
      </details>
    </fieldset>
  );
}
