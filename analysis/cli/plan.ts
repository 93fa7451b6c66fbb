/** `plan`: a locally D-optimal test session for a heater model, safe against an outlet limit. */
import { InputError, readingInput } from '../units/reading-input';
import { BUILTIN_MODELS } from '../fit';
import { MAX_PLAN_TRIALS, planSession, type PlanPrior } from '../plan/plan-session';
import { PLANNABLE_MODELS } from '../plan/model-response';
import { parseQuantity, type QuantityKind } from '../units/parse-quantity';
import { asObject, plainNumber } from '../units/read-fields';

export const help = `test-session plan: flows, order and purpose of each run (locally D-optimal at a prior)
input: {"model":"coil","prior":{"Ts":"90 degC","UA":"400 W/K"},"inletTemp":"15 degC",
        "flowRange":["2 L/min","20 L/min"],"maxOutletTemp":"95 degC","trials":8}
  model: ${PLANNABLE_MODELS.join(' | ')}; prior: a value for each parameter (coil Ts, UA; exp-inlet A, k;
    exp-approach Tinf, A, k; k as a number in s/m^3), optionally "covariance" (SI, parameter order) and "df"
    from a saved fit; without a covariance the prior is a guess (10 K on temperatures, 25 % otherwise)
  optional: "measurementU":"0.3 K" (outlet reading, default 1/sqrt(3) K), "seed":1, "level":0.95,
    "distinctFlows":4, "gridPoints":201 (21-401); trials 6-${MAX_PLAN_TRIALS}
output: {"ok":true,"runs":[{"order","flow_m3_per_s","flow_L_per_min","predictedOutletTemp_degC","piLow_degC","piHigh_degC",
         "purpose":"design|replicate|reference"}],"dEfficiency","expectedStdErr":{...},"evenlySpaced":{...},
         "optimum","feasibleRange_m3_per_s","minimumSafeFlow_m3_per_s","closedFormMinimumFlow_m3_per_s","seed","notes","cautions"}
  or {"ok":false,"reason"} when no flow in range is safe (exit 0); malformed input exits 2`;

const KIND_OF_UNIT: Record<string, QuantityKind> = { '°C': 'temperature', 'W/K': 'conductance', K: 'temperatureDifference' };

function readPrior(v: unknown, model: string): PlanPrior {
  const o = asObject(v, 'prior');
  const b = BUILTIN_MODELS[model];
  const values: Record<string, number> = {};
  for (const k of b.parameters) {
    const x = o[k];
    if (x === undefined) throw new InputError(`prior.${k} is required for model ${model} (parameters: ${b.parameters.join(', ')})`);
    const kind = KIND_OF_UNIT[b.parameterUnits[k]];
    if (typeof x === 'number' && Number.isFinite(x)) values[k] = x;
    else if (kind && typeof x === 'string') values[k] = parseQuantity(x, kind, `prior.${k}`);
    else throw new InputError(`prior.${k} must be ${kind ? 'a quantity such as "90 degC" or ' : ''}a number in ${b.parameterUnits[k]}`);
  }
  const extra = Object.keys(o).filter((k) => !b.parameters.includes(k) && k !== 'covariance' && k !== 'df');
  if (extra.length) throw new InputError(`prior has unknown fields ${extra.join(', ')} (parameters of ${model}: ${b.parameters.join(', ')}; also covariance, df)`);
  return { values, covariance: o.covariance as number[][] | undefined, df: plainNumber(o, 'df', 'prior') };
}

export function run(input: unknown): unknown {
  return readingInput((read) => {
    const o = read.asObject(input, 'input');
    if (typeof o.model !== 'string' || !(PLANNABLE_MODELS as readonly string[]).includes(o.model)) throw new InputError(`model must be one of ${PLANNABLE_MODELS.join(', ')}, got ${JSON.stringify(o.model)}`);
    if (!Array.isArray(o.flowRange) || o.flowRange.length !== 2) throw new InputError('flowRange must be [low, high], e.g. ["2 L/min", "20 L/min"]');
    const trials = plainNumber(o, 'trials');
    if (trials === undefined) throw new InputError(`trials is required (6 to ${MAX_PLAN_TRIALS})`);
    const r = planSession({
      model: o.model,
      prior: readPrior(o.prior, o.model),
      inletTempC: read.quantity(o, 'inletTemp', 'temperature', { as: 'inletTempC' }),
      flowRangeM3PerS: [0, 1].map((k) => {
        const v = parseQuantity((o.flowRange as unknown[])[k], 'volumeFlow', `flowRange[${k}]`);
        read.record(`flowRange[${k}]`, (o.flowRange as unknown[])[k], v, `flowRangeM3PerS[${k}]`);
        return v;
      }) as [number, number],
      maxOutletTempC: read.quantity(o, 'maxOutletTemp', 'temperature', { as: 'maxOutletTempC' }),
      trials,
      measurementUK: read.optionalQuantity(o, 'measurementU', 'temperatureDifference', { as: 'measurementUK' }),
      seed: plainNumber(o, 'seed'),
      level: plainNumber(o, 'level'),
      distinctFlows: plainNumber(o, 'distinctFlows'),
      gridPoints: plainNumber(o, 'gridPoints'),
    });
    if (!r.ok) return r;
    const design = (d: { flowsM3PerS: number[]; dEfficiency: number; expectedStdErr: Record<string, number> }) => ({ flows_m3_per_s: d.flowsM3PerS, dEfficiency: d.dEfficiency, expectedStdErr: d.expectedStdErr });
    return {
      ok: true, model: r.model, parameterNames: r.parameterNames,
      runs: r.runs.map((x) => ({
        order: x.order, flow_m3_per_s: x.flowM3PerS, flow_L_per_min: x.flowM3PerS * 60000, predictedOutletTemp_degC: x.predictedOutletTempC,
        piLow_degC: x.piLowC, piHigh_degC: x.piHighC, purpose: x.purpose,
      })),
      dEfficiency: r.dEfficiency, expectedStdErr: r.expectedStdErr,
      evenlySpaced: design(r.evenlySpaced),
      optimum: { points: r.optimum.points.map((s) => ({ flow_m3_per_s: s.flowM3PerS, weight: s.weight })), maxVariance: r.optimum.maxVariance },
      distinctFlows: r.distinctFlows, referenceFlow_m3_per_s: r.referenceFlowM3PerS,
      feasibleRange_m3_per_s: r.feasibleRangeM3PerS, minimumSafeFlow_m3_per_s: r.minimumSafeFlowM3PerS,
      closedFormMinimumFlow_m3_per_s: r.closedFormMinimumFlowM3PerS,
      prior: r.prior, measurementU_K: r.measurementUK, level: r.level, seed: r.seed, notes: r.notes, cautions: r.cautions,
    };
  });
}
