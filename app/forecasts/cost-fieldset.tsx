import { NumberField } from './forecast-fields';

/** The optional running cost: fuel, price per unit and efficiency (or COP). */
export function CostFieldset() {
  return (
    <fieldset className="card space-y-3 p-4">
      <legend className="px-1 font-semibold">Running cost (optional)</legend>
      <label className="block">
        <span className="field-label">Fuel</span>
        <select name="fuel" className="field-input" defaultValue="propane">
          <option value="propane">Propane (price per gal)</option>
          <option value="natural-gas">Natural gas (per therm)</option>
          <option value="electric-resistance">Electric resistance (per kWh)</option>
          <option value="heat-pump">Heat pump (per kWh; efficiency = COP)</option>
          <option value="wood">Wood (per cord)</option>
        </select>
      </label>
      <div className="grid grid-cols-2 gap-3">
        <NumberField name="price" label="Price" def="" unit="per unit" />
        <NumberField name="efficiency" label="Efficiency" def="" unit="0–1 or COP" />
      </div>
      <p className="text-xs text-ink-muted">Heating values are higher heating values (EIA). The efficiency defaults to the fuel’s typical value.</p>
    </fieldset>
  );
}
