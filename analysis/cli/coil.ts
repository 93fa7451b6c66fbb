/** `coil`: outlet temperature, heat and effectiveness of a coil in a constant-temperature source. */
import { InputError, readingInput } from '../units/reading-input';
import { minimumMassFlowKgPerS } from '../performance/coil-ntu';
import { coilAtFlow } from '../performance/coil-at-flow';
import { trialWaterProperties } from '../water/trial-water';
import { deadHeadingCaution, mergeCautions, sourceAboveBoilingCaution, temperatureCautions } from '../safety/cautions';
import { saturationTempC } from '../water/saturation-pressure';

export const help = `coil in a constant-temperature source (effectiveness-NTU, Cr -> 0)
input: {"sourceTemp":"88 degC","inletTemp":"17.5 degC","UA":"430 W/K","flow":"9 L/min"}
  or "massFlow":"0.15 kg/s" instead of flow
  the flow is the volume of outlet water (a bucket), as in the trials: mass flow with the IF97 density at the
  outlet temperature, cp at the mean of inlet and outlet, the same rule as the coil fit (so a fitted UA
  predicts the trials it came from); "flowMeasuredAt":"inlet" for a flow measured on the inlet side
output: {"outletTemp_degC", "heat_W", "effectiveness", "ntu", "massFlow_kg_per_s", "density_kg_per_m3", "cp_J_per_kg_K",
         "heatCeiling_W", "minimumFlows": [{"limit_degC", "flow_m3_per_s", "flow_L_per_min"}], "cautions"}`;

const LIMITS: [string, number][] = [['boiling', saturationTempC(101325)], ['burns in seconds', 60], ['scald', 49], ['spa', 40]];

export function run(input: unknown): unknown {
  return readingInput((read) => {
    const o = read.asObject(input, 'input');
    const Ts = read.quantity(o, 'sourceTemp', 'temperature', { as: 'sourceTempC' });
    const Tin = read.quantity(o, 'inletTemp', 'temperature', { as: 'inletTempC' });
    const ua = read.quantity(o, 'UA', 'conductance', { as: 'uaWPerK' });
    if ((o.flow === undefined) === (o.massFlow === undefined)) throw new InputError('give exactly one of flow (e.g. "9 L/min") and massFlow (e.g. "0.15 kg/s")');
    const flow = read.optionalQuantity(o, 'flow', 'volumeFlow', { as: 'flowM3PerS' });
    const massFlow = read.optionalQuantity(o, 'massFlow', 'massFlow', { as: 'massFlowKgPerS' });
    if (o.flowMeasuredAt !== undefined && o.flowMeasuredAt !== 'outlet' && o.flowMeasuredAt !== 'inlet') {
      throw new InputError(`flowMeasuredAt must be "outlet" or "inlet", got ${JSON.stringify(o.flowMeasuredAt)}`);
    }
    const at = o.flowMeasuredAt === 'inlet' ? 'inlet' : 'outlet';
    if ((flow ?? massFlow ?? 0) < 0) throw new InputError(`${flow === undefined ? 'massFlow' : 'flow'} must not be negative, got ${JSON.stringify(o.flow ?? o.massFlow)}`);
    if (!(Ts > Tin)) throw new InputError(`sourceTemp (${JSON.stringify(o.sourceTemp)}) must be above inletTemp (${JSON.stringify(o.inletTemp)}) for a heater`);
    if (ua <= 0) throw new InputError(`UA must be greater than 0, got ${JSON.stringify(o.UA)}`);
    trialWaterProperties(Tin, Tin, at, { inlet: 'inletTemp', outlet: 'inletTemp' }); // liquid inlet, or the message names it
    const boil = sourceAboveBoilingCaution(Ts, LIMITS[0][1]);
    if ((flow ?? massFlow) === 0) {
      return { outletTemp_degC: Ts, heat_W: 0, effectiveness: 1, ntu: null, massFlow_kg_per_s: 0, heatCeiling_W: ua * (Ts - Tin),
        minimumFlows: [], cautions: mergeCautions([deadHeadingCaution('zero flow')], boil ? [boil] : [], temperatureCautions(Ts, 'coil water')) };
    }
    const r = coilAtFlow({ sourceTempC: Ts, inletTempC: Tin, uaWPerK: ua, flowM3PerS: flow, massFlowKgPerS: massFlow, measuredAt: at });
    const minimumFlows = LIMITS.filter(([, lim]) => Ts > lim && lim > Tin).map(([name, lim]) => {
      // at the minimum flow the outlet is at the limit: the water properties are those of that trial
      const w = trialWaterProperties(Tin, Math.min(lim, 99.97), at);
      const mMin = minimumMassFlowKgPerS({ sourceTempC: Ts, inletTempC: Tin, limitTempC: lim, uaWPerK: ua, cpJPerKgK: w.cpJPerKgK });
      return { limit: name, limit_degC: lim, massFlow_kg_per_s: mMin, flow_m3_per_s: mMin / w.densityKgPerM3, flow_L_per_min: (mMin / w.densityKgPerM3) * 60000 };
    });
    return {
      outletTemp_degC: r.outletTempC, heat_W: r.heatW, effectiveness: r.effectiveness, ntu: r.ntu, massFlow_kg_per_s: r.massFlowKgPerS,
      density_kg_per_m3: r.densityKgPerM3, cp_J_per_kg_K: r.cpJPerKgK,
      heatCeiling_W: r.heatCeilingW, minimumFlows,
      cautions: mergeCautions(temperatureCautions(r.outletTempC, 'outlet'), boil ? [boil] : []),
    };
  });
}
