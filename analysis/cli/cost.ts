/** `cost`: cost per useful therm and per degree, a build-cost sheet, payback. */
import { InputError, readingInput } from '../units/reading-input';
import { FUELS, type FuelKind } from '../cost/fuels';
import { costPerDegree, usefulHeatCost } from '../cost/useful-heat-cost';
import { buildCostSheet, type BuildItem } from '../cost/build-cost';
import { payback } from '../cost/payback';

export const help = `cost of useful heat, per degree of a pool, build-cost sheet and payback
input: {"fuel":"propane","price":2.50,"efficiency":0.8,"poolVolume":"40 m^3",
        "build":{"items":[{"subassembly":"coil","description":"copper tube","quantity":1,"unitCost":120}],"taxRate":0.08},
        "payback":{"otherFuel":"natural-gas","otherPrice":1.2,"otherEfficiency":0.85,"annualUsefulHeat":"500 therm"}}
  fuel: natural-gas ($/therm) | propane ($/gal) | electric-resistance ($/kWh) | heat-pump ($/kWh, efficiency = COP) | wood ($/cord)
  heat contents are HHV (EIA); optional "heatContent":"91452 Btu" per price unit
output: {"cost_per_useful_therm", "cost_per_useful_kWh", "cost_per_degF", "cost_per_K", "basis", "source", "build", "payback"}`;

function fuelOf(v: unknown, field: string): FuelKind {
  if (typeof v !== 'string' || !(v in FUELS)) throw new InputError(`${field} must be one of ${Object.keys(FUELS).join(', ')}, got ${JSON.stringify(v)}`);
  return v as FuelKind;
}

export function run(input: unknown): unknown {
  return readingInput((read) => {
    const o = read.asObject(input, 'input');
    const fuel = fuelOf(o.fuel, 'fuel');
    const price = read.plainNumber(o, 'price', { as: 'pricePerUnit' });
    if (price === undefined) throw new InputError('price is required (per therm, gal, kWh or cord)');
    const c = usefulHeatCost({
      fuel, pricePerUnit: price, efficiency: read.plainNumber(o, 'efficiency', { as: fuel === 'heat-pump' ? 'cop' : 'efficiency' }),
      heatContentJ: read.optionalQuantity(o, 'heatContent', 'energy', { as: 'heatContentJ' }),
    });
    const out: Record<string, unknown> = {
      cost_per_useful_therm: c.perUsefulTherm, cost_per_useful_kWh: c.perUsefulKWh, efficiency: c.efficiency,
      heatContent_J_per_unit: c.heatContentJ, priceUnit: c.priceUnit, basis: c.basis, source: FUELS[fuel].source,
    };
    const vol = read.optionalQuantity(o, 'poolVolume', 'volume', { as: 'volumeM3' });
    if (vol !== undefined) {
      const d = costPerDegree(vol, c.perUsefulTherm);
      out.cost_per_degF = d.perDegF;
      out.cost_per_K = d.perK;
    }
    if (o.build !== undefined) {
      const b = read.asObject(o.build, 'build');
      const items = (b.items ?? []) as BuildItem[];
      // the sheet names its lines items[i]; the user wrote them under build
      if (Array.isArray(items)) items.forEach((_, i) => ['quantity', 'unitCost', 'subassembly'].forEach((k) => read.record(`build.items[${i}].${k}`, undefined, Number.NaN, `items[${i}].${k}`)));
      out.build = buildCostSheet(items, read.plainNumber(b, 'taxRate', { path: 'build', as: 'taxRate', fallback: 0 }) as number);
    }
    if (o.payback !== undefined) {
      const p = read.asObject(o.payback, 'payback');
      // a second fuel: its own reader, so its price is told as payback.otherPrice, not price
      const other = readingInput((inner) => usefulHeatCost({
        fuel: fuelOf(p.otherFuel, 'payback.otherFuel'), pricePerUnit: inner.plainNumber(p, 'otherPrice', { path: 'payback', as: 'pricePerUnit' }) as number,
        efficiency: inner.plainNumber(p, 'otherEfficiency', { path: 'payback', as: p.otherFuel === 'heat-pump' ? 'cop' : 'efficiency' }),
      }));
      const capital = read.plainNumber(p, 'capitalCost', { path: 'payback', as: 'capitalCost' }) ?? (out.build as { total: number } | undefined)?.total;
      if (capital === undefined) throw new InputError('payback.capitalCost is required when there is no build sheet');
      const annual = read.optionalQuantity(p, 'annualUsefulHeat', 'energy', { path: 'payback', as: 'annualUsefulHeatJ' });
      if (annual === undefined) throw new InputError('payback.annualUsefulHeat is required (e.g. "500 therm")');
      const r = payback({ capitalCost: capital, annualUsefulHeatJ: annual, perUsefulThermThis: c.perUsefulTherm, perUsefulThermOther: other.perUsefulTherm, lifeYears: read.plainNumber(p, 'lifeYears', { path: 'payback', as: 'lifeYears' }) });
      out.payback = { ...r, years_y: r.years, otherCost_per_useful_therm: other.perUsefulTherm };
    }
    return out;
  });
}
