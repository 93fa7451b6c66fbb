/** `collector`: steady-state efficiency curve of a solar collector test (ISO 9806 form). */
import { InputError, readingInput } from '../units/reading-input';
import { collectorTest, type CollectorTrial } from '../performance/collector-test';
import { ISO9806_STEADY_LIMITS } from '../performance/collector-steadiness';
import type { FieldReader, Fields } from '../units/read-fields';
import type { QuantityKind } from '../units/parse-quantity';

export const help = `solar collector efficiency test (ISO 9806 steady-state form): eta0, a1, a2 from steady trials
  eta = m*cp*(Tout - Tin)/(A*G) against x = (Tm - Ta)/G, fitted as eta = eta0 - a1*x - a2*G*x^2 by (weighted)
  linear least squares; the quasi-dynamic form is not covered
input: {"grossArea":"2 m^2","trials":[{"irradiance":"950 W/m^2","inletTemp":"25 degC","outletTemp":"31 degC",
         "ambientTemp":"22 degC","flow":"2 L/min"},...]}
  area: "grossArea" or "apertureArea" (the coefficients are on that basis; with both, gross unless "areaBasis":"aperture")
  per trial: "flow" (volume, density at the inlet) or "massFlow"; optional "wind":"3 m/s" and
    "spread":{"irradiance":"20 W/m^2","ambientTemp":"0.5 K","inletTemp":"0.05 K","flow":0.004} (largest deviations
    from the period mean; flow as a fraction): trials beyond the steadiness limits are excluded
  optional: "fluid":{"cp":"3.8 kJ/(kg K)","density":"1040 kg/m^3"} (default IAPWS-IF97 water), "order":1|2,
    "uncertainty":{"temperatureDifference":"0.05 K","flowRelative":0.005,"irradianceRelative":0.015} (weights 1/u^2),
    "level":0.95, "bandIrradiance":"1000 W/m^2", at most 10000 trials
output: {"ok":true,"eta0":{"value","stdErr","ciLow","ciHigh"},"a1_W_per_m2K":{...},"a2_W_per_m2K2":{...},"n","df","r2",
         "residualSD","covariance","parameterNames","areaBasis","area_m2","otherBasis","points","excluded","band","warnings"}
  or {"ok":false,"reason"} for too few valid trials or a degenerate spread of x (exit 0); malformed input exits 2`;

const est = (e: { value: number; stdErr: number; ciLow: number; ciHigh: number }, k = 1) => ({ value: e.value * k, stdErr: e.stdErr * k, ciLow: e.ciLow * k, ciHigh: e.ciHigh * k });

function readTrial(read: FieldReader, v: unknown, i: number): CollectorTrial {
  const path = `trials[${i}]`;
  const t = read.asObject(v, path);
  const s = t.spread === undefined ? undefined : read.asObject(t.spread, `${path}.spread`);
  const q = (f: Fields, key: string, kind: QuantityKind, p: string, as: string) => read.optionalQuantity(f, key, kind, { path: p, as: `${path}.${as}` });
  const sp = `${path}.spread`;
  return {
    irradianceWPerM2: read.quantity(t, 'irradiance', 'irradiance', { path, as: `${path}.irradianceWPerM2` }),
    inletTempC: read.quantity(t, 'inletTemp', 'temperature', { path, as: `${path}.inletTempC` }),
    outletTempC: read.quantity(t, 'outletTemp', 'temperature', { path, as: `${path}.outletTempC` }),
    ambientTempC: read.quantity(t, 'ambientTemp', 'temperature', { path, as: `${path}.ambientTempC` }),
    flowM3PerS: q(t, 'flow', 'volumeFlow', path, 'flowM3PerS'),
    massFlowKgPerS: q(t, 'massFlow', 'massFlow', path, 'massFlowKgPerS'),
    windMPerS: q(t, 'wind', 'speed', path, 'windMPerS'),
    spread: s && {
      irradianceWPerM2: q(s, 'irradiance', 'irradiance', sp, 'spread.irradianceWPerM2'),
      ambientTempK: q(s, 'ambientTemp', 'temperatureDifference', sp, 'spread.ambientTempK'),
      inletTempK: q(s, 'inletTemp', 'temperatureDifference', sp, 'spread.inletTempK'),
      flowRelative: read.plainNumber(s, 'flow', { path: sp, as: `${path}.spread.flowRelative` }),
    },
  };
}

export function run(input: unknown): unknown {
  return readingInput((read) => {
    const o = read.asObject(input, 'input');
    const gross = read.optionalQuantity(o, 'grossArea', 'area', { as: 'grossAreaM2' });
    const aperture = read.optionalQuantity(o, 'apertureArea', 'area', { as: 'apertureAreaM2' });
    if (gross === undefined && aperture === undefined) throw new InputError('grossArea or apertureArea is required (e.g. "2 m^2")');
    if (o.areaBasis !== undefined && o.areaBasis !== 'gross' && o.areaBasis !== 'aperture') throw new InputError(`areaBasis must be "gross" or "aperture", got ${JSON.stringify(o.areaBasis)}`);
    const basis = o.areaBasis === 'aperture' || gross === undefined ? 'aperture' : 'gross';
    const area = basis === 'gross' ? gross : aperture;
    if (area === undefined) throw new InputError('areaBasis "aperture" needs apertureArea');
    read.record(basis === 'gross' ? 'grossArea' : 'apertureArea', basis === 'gross' ? o.grossArea : o.apertureArea, area, 'areaM2');
    if (!Array.isArray(o.trials)) throw new InputError('trials must be an array of trial objects');
    if (o.trials.length > 10_000) throw new InputError(`trials: at most 10000 trials, got ${o.trials.length}`);
    if (o.order !== undefined && o.order !== 1 && o.order !== 2) throw new InputError(`order must be 1 or 2, got ${JSON.stringify(o.order)}`);
    const fluid = o.fluid === undefined ? undefined : read.asObject(o.fluid, 'fluid');
    const unc = o.uncertainty === undefined ? undefined : read.asObject(o.uncertainty, 'uncertainty');
    const r = collectorTest({
      trials: o.trials.map((t, i) => readTrial(read, t, i)),
      areaM2: area,
      areaBasis: basis,
      fluid: fluid && {
        cpJPerKgK: read.optionalQuantity(fluid, 'cp', 'specificHeat', { path: 'fluid', as: 'fluid.cpJPerKgK' }),
        densityKgPerM3: read.optionalQuantity(fluid, 'density', 'density', { path: 'fluid', as: 'fluid.densityKgPerM3' }),
      },
      uncertainty: unc && {
        temperatureDifferenceK: read.optionalQuantity(unc, 'temperatureDifference', 'temperatureDifference', { path: 'uncertainty', as: 'uncertainty.temperatureDifferenceK' }),
        flowRelative: read.plainNumber(unc, 'flowRelative', { path: 'uncertainty' }),
        irradianceRelative: read.plainNumber(unc, 'irradianceRelative', { path: 'uncertainty' }),
      },
      order: o.order as 1 | 2 | undefined,
      level: read.plainNumber(o, 'level'),
      bandIrradianceWPerM2: read.optionalQuantity(o, 'bandIrradiance', 'irradiance', { as: 'bandIrradianceWPerM2' }),
    });
    if (!r.ok) return r;
    const other = basis === 'gross' ? aperture : gross;
    const k = other === undefined ? 1 : r.areaM2 / other; // the same power on the other area: coefficients scale by A_used/A_other
    return {
      ok: true,
      eta0: est(r.eta0), a1_W_per_m2K: est(r.a1WPerM2K), a2_W_per_m2K2: est(r.a2WPerM2K2),
      n: r.n, df: r.df, r2: r.r2, residualSD: r.residualSD, weighted: r.weighted, level: r.level,
      parameterNames: r.parameterNames, covariance: r.covariance,
      areaBasis: r.areaBasis, area_m2: r.areaM2,
      otherBasis: other === undefined ? null : {
        areaBasis: basis === 'gross' ? 'aperture' : 'gross', area_m2: other,
        eta0: est(r.eta0, k), a1_W_per_m2K: est(r.a1WPerM2K, k), a2_W_per_m2K2: est(r.a2WPerM2K2, k),
      },
      points: r.points.map((p) => ({
        index: p.index, efficiency: p.efficiency, x_m2K_per_W: p.xM2KPerW, fitted: p.fitted, residual: p.residual,
        heat_W: p.heatW, meanTemp_degC: p.meanTempC, massFlow_kg_per_s: p.massFlowKgPerS, efficiencyU: p.efficiencyU,
      })),
      excluded: r.excluded,
      band: r.band.map((b) => ({ x_m2K_per_W: b.xM2KPerW, efficiency: b.efficiency, ciLow: b.ciLow, ciHigh: b.ciHigh, extrapolated: b.extrapolated })),
      bandIrradiance_W_per_m2: r.bandIrradianceWPerM2,
      limits: ISO9806_STEADY_LIMITS,
      warnings: r.warnings,
    };
  });
}
