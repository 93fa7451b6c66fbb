/** `coil`: outlet temperature, heat and effectiveness of a coil in a constant-temperature source. */
import { InputError } from './input-error';
import { coilPerformance, minimumMassFlowKgPerS } from '../performance/coil-ntu';
import { asObject, quantity } from '../units/read-fields';
import { waterCpJPerKgK, waterDensityKgPerM3 } from '../water/water-properties';
import { deadHeadingCaution, mergeCautions, sourceAboveBoilingCaution, temperatureCautions } from '../safety/cautions';
import { saturationTempC } from '../water/saturation-pressure';

export const help = `coil in a constant-temperature source (effectiveness-NTU, Cr -> 0)
input: {"sourceTemp":"90 degC","inletTemp":"20 degC","UA":"500 W/K","flow":"6 L/min"}
  mass flow uses the IF97 density at the inlet temperature, cp at the inlet temperature
output: {"outletTemp_degC", "heat_W", "effectiveness", "ntu", "massFlow_kg_per_s", "heatCeiling_W",
         "minimumFlows": [{"limit_degC", "flow_m3_per_s", "flow_L_per_min"}], "cautions"}`;

const LIMITS: [string, number][] = [['boiling', saturationTempC(101325)], ['burns in seconds', 60], ['scald', 49], ['spa', 40]];

export function run(input: unknown): unknown {
  try {
    const o = asObject(input, 'input');
    const Ts = quantity(o, 'sourceTemp', 'temperature');
    const Tin = quantity(o, 'inletTemp', 'temperature');
    const ua = quantity(o, 'UA', 'conductance');
    const flow = quantity(o, 'flow', 'volumeFlow');
    if (flow < 0) throw new InputError(`flow must not be negative, got ${JSON.stringify(o.flow)}`);
    if (!(Ts > Tin)) throw new InputError(`sourceTemp (${Ts} °C) must be above inletTemp (${Tin} °C) for a heater`);
    if (ua <= 0) throw new InputError(`UA must be greater than 0, got ${JSON.stringify(o.UA)}`);
    const rho = waterDensityKgPerM3(Tin, undefined, 'inletTemp');
    const cp = waterCpJPerKgK(Tin, undefined, 'inletTemp');
    const boil = sourceAboveBoilingCaution(Ts, LIMITS[0][1]);
    if (flow === 0) {
      return { outletTemp_degC: Ts, heat_W: 0, effectiveness: 1, ntu: null, massFlow_kg_per_s: 0, heatCeiling_W: ua * (Ts - Tin),
        minimumFlows: [], cautions: mergeCautions([deadHeadingCaution('zero flow')], boil ? [boil] : [], temperatureCautions(Ts, 'coil water')) };
    }
    const m = rho * flow;
    const r = coilPerformance({ sourceTempC: Ts, inletTempC: Tin, uaWPerK: ua, massFlowKgPerS: m, cpJPerKgK: cp });
    const minimumFlows = LIMITS.filter(([, lim]) => Ts > lim && lim > Tin).map(([name, lim]) => {
      const mMin = minimumMassFlowKgPerS({ sourceTempC: Ts, inletTempC: Tin, limitTempC: lim, uaWPerK: ua, cpJPerKgK: cp });
      return { limit: name, limit_degC: lim, massFlow_kg_per_s: mMin, flow_m3_per_s: mMin / rho, flow_L_per_min: (mMin / rho) * 60000 };
    });
    return {
      outletTemp_degC: r.outletTempC, heat_W: r.heatW, effectiveness: r.effectiveness, ntu: r.ntu, massFlow_kg_per_s: m,
      heatCeiling_W: r.heatCeilingW, minimumFlows,
      cautions: mergeCautions(temperatureCautions(r.outletTempC, 'outlet'), boil ? [boil] : []),
    };
  } catch (e) {
    if (e instanceof TypeError || e instanceof RangeError) throw new InputError(e.message);
    throw e;
  }
}
