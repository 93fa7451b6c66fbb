/** `uncertainty`: GUM budget of a bucket-and-thermometer trial. */
import { InputError, readingInput } from '../units/reading-input';
import { heatRateBudget } from '../trial/heat-rate-budget';
import type { Budget } from '../trial/gum-budget';
import { parseQuantity } from '../units/parse-quantity';

export const help = `GUM uncertainty budget (JCGM 100:2008) of flow and heat rate for a bucket trial
input: {"bucketVolume":"20 L","volumeTolerance":"0.1 L","fillTimes":["79.8 s","80.4 s","80.1 s"],
        "timingUncertainty":"0.1 s","inletTemp":"17.5 degC","outletTemp":"45 degC","sensorTolerance":"0.5 K",
        "sensorCorrelation":0, "density":"990 kg/m^3", "cp":"4.18 kJ/(kg K)", "level":0.95 | "k":2}
  tolerances are half-widths of rectangular distributions; density and cp default to IAPWS-IF97
output: {"flow_m3_per_s", "flowUc_m3_per_s", "heat_W", "heatUc_W", "heatU_W", "heatRelative", "k", "nuEff", "budget": [...]}`;

function rows(b: Budget) {
  return b.rows.map((r) => ({
    quantity: r.name, value: r.value, unit: r.unit, u: r.u, distribution: r.distribution, dof: Number.isFinite(r.dof) ? r.dof : null,
    sensitivity: r.sensitivity, contribution: r.contribution, percent: r.percent,
  }));
}

export function run(input: unknown): unknown {
  return readingInput((read) => {
    const o = read.asObject(input, 'input');
    if (!Array.isArray(o.fillTimes) || o.fillTimes.length === 0) throw new InputError('fillTimes must be a non-empty array such as ["80 s"]');
    const fillTimesS = o.fillTimes.map((t, i) => {
      const v = parseQuantity(t, 'time', `fillTimes[${i}]`);
      read.record(`fillTimes[${i}]`, t, v, `fillTimesS[${i}]`);
      return v;
    });
    const b = heatRateBudget({
      bucketVolumeM3: read.quantity(o, 'bucketVolume', 'volume', { as: 'bucketVolumeM3' }),
      volumeHalfWidthM3: read.optionalQuantity(o, 'volumeTolerance', 'volume', { as: 'volumeHalfWidthM3' }),
      fillTimesS,
      timingEventUncertaintyS: read.optionalQuantity(o, 'timingUncertainty', 'time', { as: 'timingEventUncertaintyS' }),
      inletTempC: read.quantity(o, 'inletTemp', 'temperature', { as: 'inletTempC' }),
      outletTempC: read.quantity(o, 'outletTemp', 'temperature', { as: 'outletTempC' }),
      sensorHalfWidthK: read.quantity(o, 'sensorTolerance', 'temperatureDifference', { as: 'sensorHalfWidthK' }),
      sensorCorrelation: read.plainNumber(o, 'sensorCorrelation'),
      densityKgPerM3: read.optionalQuantity(o, 'density', 'density', { as: 'densityKgPerM3' }),
      cpJPerKgK: read.optionalQuantity(o, 'cp', 'specificHeat', { as: 'cpJPerKgK' }),
      level: read.plainNumber(o, 'level'),
      k: read.plainNumber(o, 'k'),
    });
    return {
      flow_m3_per_s: b.flow.value, flowUc_m3_per_s: b.flow.uc, flowU_m3_per_s: b.flow.U,
      heat_W: b.heat.value, heatUc_W: b.heat.uc, heatU_W: b.heat.U, heatRelative: b.heat.ucRelative,
      k: b.heat.k, nuEff: Number.isFinite(b.heat.nuEff) ? b.heat.nuEff : null, level: b.heat.level,
      density_kg_per_m3: b.densityKgPerM3, cp_J_per_kg_K: b.cpJPerKgK,
      budget: { flow: rows(b.flow), heat: rows(b.heat) },
    };
  });
}
