/** `compare`: two heater designs from their trials — UA ratio, Ts difference and delivered heat, in words. */
import { InputError, readingInput } from '../units/reading-input';
import { compareDesigns, MAX_COMPARE_POINTS, type DeltaInterval, type DesignData } from '../compare/compare-designs';
import { parseQuantity } from '../units/parse-quantity';
import { asObject, plainNumber } from '../units/read-fields';

export const help = `compare two designs: UA ratio, Ts difference and delivered heat with intervals, and a verdict in words
  each design is fitted on its own (default the coil model); UA_B/UA_A and Ts_B - Ts_A by the delta method
  (independent fits, Welch-Satterthwaite t intervals) with a residual-bootstrap check, and the heat each delivers at
  common inlet and flows, with a verdict in words
input: {"model":"coil","a":{"x":[...],"y":[...],"covariates":{"Tin":[...]}},"b":{...}}
  x = flow (m^3/s), y = outlet (degC), covariates Tin (degC), optional rho (kg/m^3), cp (J/(kg K)); optional
  "weights" and "model" per design (designs fitted with different models are compared on heat only); at most
  ${MAX_COMPARE_POINTS} trials each
  optional: "labels":["A","B"], "inletTemp":"15 degC" (default the mean Tin), "flows":["5 L/min",...] (at most 50;
    default five over the overlap of the tested flows), "verdictFlow":"10 L/min", "flowUnit":"L/min", "level":0.95,
    "bootstrap":{"resamples":400,"seed":1} or false
output: {"ok":true,"UA_ratio":{"value","ciLow","ciHigh","stdErr","df"},"Ts_difference_K":{...},
         "heatAt":[{"flow_m3_per_s","a":{"heat_W","ciLow_W","ciHigh_W"},"b":{...},"difference_percent":{...},"extrapolated","verdict"}],
         "verdict":"...","bootstrap","fits","notes"}
  or {"ok":false,"reason"} when a fit cannot be done (exit 0); malformed input exits 2`;

function numbers(v: unknown, name: string): number[] {
  if (!Array.isArray(v)) throw new InputError(`${name} must be an array of numbers`);
  return v.map((e, i) => {
    if (typeof e !== 'number' || !Number.isFinite(e)) throw new InputError(`${name}[${i}] is not a finite number (got ${JSON.stringify(e)})`);
    return e;
  });
}

function readDesign(v: unknown, name: string): DesignData {
  const d = asObject(v, name);
  const x = numbers(d.x, `${name}.x`);
  if (x.length > MAX_COMPARE_POINTS) throw new InputError(`${name}: at most ${MAX_COMPARE_POINTS} trials, got ${x.length}`);
  const y = numbers(d.y, `${name}.y`);
  if (y.length !== x.length) throw new InputError(`${name}.y has ${y.length} values but ${name}.x has ${x.length}`);
  const c = asObject(d.covariates ?? {}, `${name}.covariates`);
  const covariates = Object.fromEntries(Object.entries(c).map(([k, a]) => [k, numbers(a, `${name}.covariates.${k}`)]));
  if (d.model !== undefined && typeof d.model !== 'string') throw new InputError(`${name}.model must be a model name`);
  return { x, y, covariates, weights: d.weights === undefined ? undefined : numbers(d.weights, `${name}.weights`), model: d.model as string | undefined };
}

const interval = (d: DeltaInterval | null) => d && { value: d.value, ciLow: d.ciLow, ciHigh: d.ciHigh, stdErr: d.stdErr, df: d.df };

export function run(input: unknown): unknown {
  return readingInput((read) => {
    const o = read.asObject(input, 'input');
    if (o.model !== undefined && typeof o.model !== 'string') throw new InputError('model must be a model name such as "coil"');
    if (o.labels !== undefined && (!Array.isArray(o.labels) || o.labels.length !== 2 || o.labels.some((l) => typeof l !== 'string' || l.length === 0 || l.length > 40))) throw new InputError('labels must be two names of at most 40 characters');
    if (o.flows !== undefined && (!Array.isArray(o.flows) || o.flows.length === 0 || o.flows.length > 50)) throw new InputError('flows must list 1 to 50 flows such as "10 L/min"');
    if (o.flowUnit !== undefined && typeof o.flowUnit !== 'string') throw new InputError('flowUnit must be a unit of volume flow such as "L/min"');
    let bootstrap: { resamples?: number; seed?: number } | false | undefined;
    if (o.bootstrap === false) bootstrap = false;
    else if (o.bootstrap !== undefined) {
      const b = asObject(o.bootstrap, 'bootstrap');
      bootstrap = { resamples: plainNumber(b, 'resamples', 'bootstrap'), seed: plainNumber(b, 'seed', 'bootstrap') };
    }
    if (typeof o.flowUnit === 'string') parseQuantity(`1 ${o.flowUnit}`, 'volumeFlow', 'flowUnit');
    const r = compareDesigns({
      a: readDesign(o.a, 'a'), b: readDesign(o.b, 'b'),
      model: o.model as string | undefined,
      labels: o.labels as [string, string] | undefined,
      inletTempC: read.optionalQuantity(o, 'inletTemp', 'temperature', { as: 'inletTempC' }),
      flowsM3PerS: (o.flows as unknown[] | undefined)?.map((f, i) => {
        const v = parseQuantity(f, 'volumeFlow', `flows[${i}]`);
        read.record(`flows[${i}]`, f, v, `flowsM3PerS[${i}]`);
        return v;
      }),
      verdictFlowM3PerS: read.optionalQuantity(o, 'verdictFlow', 'volumeFlow', { as: 'verdictFlowM3PerS' }),
      flowUnit: o.flowUnit as string | undefined,
      level: plainNumber(o, 'level'),
      bootstrap,
    });
    if (!r.ok) return r;
    return {
      ok: true, labels: r.labels, models: r.models,
      UA_ratio: interval(r.uaRatio), Ts_difference_K: interval(r.tsDifferenceK),
      inletTemp_degC: r.inletTempC, level: r.level,
      heatAt: r.heatAt.map((h) => ({
        flow_m3_per_s: h.flowM3PerS,
        a: { heat_W: h.a.heatW, ciLow_W: h.a.ciLow, ciHigh_W: h.a.ciHigh },
        b: { heat_W: h.b.heatW, ciLow_W: h.b.ciLow, ciHigh_W: h.b.ciHigh },
        difference_percent: interval(h.differencePercent), extrapolated: h.extrapolated, verdict: h.verdict,
      })),
      verdictFlow_m3_per_s: r.verdictFlowM3PerS, verdict: r.verdict,
      bootstrap: r.bootstrap && {
        resamples: r.bootstrap.resamples, seed: r.bootstrap.seed, failures: r.bootstrap.failures,
        UA_ratio: r.bootstrap.uaRatio, Ts_difference_K: r.bootstrap.tsDifferenceK, difference_percent: r.bootstrap.differencePercent,
      },
      fits: r.fits, notes: r.notes,
    };
  });
}
