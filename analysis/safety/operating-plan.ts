/**
 * Checks an operating plan — the ordered steps of running a heater (pump, valves, flow, fire,
 * waits, cover) — by walking its state step by step, and returns the cautions with the step where
 * each arises: the fire lit before water flows, a heated coil with no flow (dead-heading, the rule
 * of plan-check.ts), a closed loop heated without a relief path, the pump stopped while the fire
 * burns or the coil is hot, and a plan that ends with the fire lit. DOMAIN.md §5 ("start flow
 * before lighting and keep it until the coil is cold", "keep an open, unvalved vent or relief
 * path", "warn when a test plan includes a closed-valve or zero-flow step"); common practice, and
 * local codes have the last word. Pure and dependency-light: the browser runs the same rule.
 */
import { CAUTION_THRESHOLDS_C, closedLoopNoReliefCaution, deadHeadingCaution, planEndsLitCaution, pumpAfterFireCaution, pumpStoppedHotCaution, thresholdText, type Caution } from './cautions';
import { coilDeadHeaded } from './plan-check';

export const OPERATING_STEP_KINDS = ['pump-on', 'pump-off', 'valve-open', 'valve-closed', 'flow-set', 'fire-lit', 'fire-out', 'wait', 'wait-until-cold', 'cover-on', 'cover-off'] as const;
export type OperatingStepKind = (typeof OPERATING_STEP_KINDS)[number];
/** The valves a plan can name: supply and return are in the coil's path, the vent is its relief path. */
export const PLAN_VALVES = ['supply', 'return', 'bypass', 'vent'] as const;
export type PlanValve = (typeof PLAN_VALVES)[number];
export const LOOP_KINDS = ['open', 'closed'] as const;
export const RELIEF_KINDS = ['relief-valve', 'open-vent', 'none'] as const;

/** One step; the fields beyond `kind` belong to the kinds named beside them. */
export interface OperatingStep {
  kind: OperatingStepKind;
  /** valve-open, valve-closed */
  valve?: PlanValve;
  /** flow-set: the flow, m³/s (0 stops the water) */
  flowM3PerS?: number;
  /** wait: minutes */
  minutes?: number;
  /** wait-until-cold: the coil temperature waited for, °C */
  coilBelowC?: number;
  note?: string;
}

/** The loop the plan runs: open (to a pool or tank open to the air) or closed, and its relief path. */
export interface LoopFacts {
  loop: (typeof LOOP_KINDS)[number];
  relief: (typeof RELIEF_KINDS)[number];
}

/** A caution of a plan, with the step (1-based) where it arises. */
export type PlanCaution = Caution & { step: number };

/** A few words for each kind, as a step is named in a caution: 'step 3 (fire lit)'. */
export const STEP_WORDS: Record<OperatingStepKind, string> = {
  'pump-on': 'pump on', 'pump-off': 'pump off', 'valve-open': 'valve opened', 'valve-closed': 'valve closed', 'flow-set': 'flow set',
  'fire-lit': 'fire lit', 'fire-out': 'fire out', wait: 'wait', 'wait-until-cold': 'wait until the coil is cold', 'cover-on': 'cover on', 'cover-off': 'cover off',
};

const finite = (x: unknown): x is number => typeof x === 'number' && Number.isFinite(x);

function checkStep(s: OperatingStep, i: number): void {
  const at = `steps[${i}]`;
  if (!OPERATING_STEP_KINDS.includes(s?.kind)) throw new TypeError(`${at}.kind must be one of ${OPERATING_STEP_KINDS.join(', ')}, got ${String(s?.kind)}`);
  if ((s.kind === 'valve-open' || s.kind === 'valve-closed') && !PLAN_VALVES.includes(s.valve as PlanValve)) throw new TypeError(`${at}.valve must be one of ${PLAN_VALVES.join(', ')}, got ${String(s.valve)}`);
  if (s.kind === 'flow-set' && !(finite(s.flowM3PerS) && s.flowM3PerS >= 0)) throw new RangeError(`${at}.flowM3PerS must be a finite flow ≥ 0, got ${String(s.flowM3PerS)}`);
  if (s.kind === 'wait' && !(finite(s.minutes) && s.minutes > 0)) throw new RangeError(`${at}.minutes must be a finite number > 0, got ${String(s.minutes)}`);
  if (s.kind === 'wait-until-cold' && !finite(s.coilBelowC)) throw new TypeError(`${at}.coilBelowC must be a finite temperature, got ${String(s.coilBelowC)}`);
}

/**
 * Walks the plan from a cold, stopped rig (pump off, fire out, every valve open, the pump's own
 * flow) and raises each hazard at the step where it begins; a hazard that lasts over several
 * steps is raised once. A coil counts as cold only after a wait-until-cold with the fire out and a
 * temperature below the 49 °C scald threshold (cautions.ts).
 * @param steps the plan, in order
 * @param loop the loop's facts
 * @returns the cautions in step order (none for a safe plan)
 * @throws TypeError / RangeError naming the step and field of a malformed step or loop
 * @example checkOperatingPlan([{ kind: 'fire-lit' }, { kind: 'pump-on' }], { loop: 'open', relief: 'none' })[0].code // 'pump-after-fire'
 */
export function checkOperatingPlan(steps: readonly OperatingStep[], loop: LoopFacts): PlanCaution[] {
  if (!Array.isArray(steps)) throw new TypeError('steps must be an array');
  if (!LOOP_KINDS.includes(loop?.loop) || !RELIEF_KINDS.includes(loop?.relief)) throw new TypeError(`loop must be { loop: ${LOOP_KINDS.join('|')}, relief: ${RELIEF_KINDS.join('|')} }`);
  steps.forEach(checkStep);
  const st = { pumpOn: false, fireLit: false, hot: false, flowM3PerS: null as number | null, closed: new Set<PlanValve>(), coolNote: '' };
  const out: PlanCaution[] = [];
  let stalled = false;
  let unrelieved = false;
  steps.forEach((s: OperatingStep, i: number) => {
    const where = `step ${i + 1} (${s.kind.startsWith('valve') ? `${s.valve} ${STEP_WORDS[s.kind]}` : STEP_WORDS[s.kind]})`;
    const add = (c: Caution) => out.push({ ...c, step: i + 1 });
    const hotBefore = st.fireLit || st.hot;
    switch (s.kind) {
      case 'pump-on': st.pumpOn = true; break;
      case 'pump-off': st.pumpOn = false; break;
      case 'valve-open': st.closed.delete(s.valve!); break;
      case 'valve-closed': st.closed.add(s.valve!); break;
      case 'flow-set': st.flowM3PerS = s.flowM3PerS!; break;
      case 'fire-lit': st.fireLit = true; st.hot = true; st.coolNote = ''; break;
      case 'fire-out': st.fireLit = false; break;
      case 'wait-until-cold':
        if (st.fireLit) break;
        if (s.coilBelowC! < CAUTION_THRESHOLDS_C.scald) st.hot = false;
        else st.coolNote = ` (the plan waits only until it is below ${thresholdText(s.coilBelowC!)}, not below the ${thresholdText(CAUTION_THRESHOLDS_C.scald)} scald threshold)`;
        break;
      default: break;
    }
    const heated = st.fireLit || st.hot;
    const dead = coilDeadHeaded({ heated, pumpOn: st.pumpOn, flowM3PerS: st.flowM3PerS, pathClosed: st.closed.has('supply') || st.closed.has('return') });
    if (dead && !stalled) {
      if (s.kind === 'fire-lit' && !hotBefore) add(pumpAfterFireCaution(where));
      else if (s.kind === 'pump-off') add(pumpStoppedHotCaution(where, st.fireLit ? 'the fire is still lit' : `the coil is still hot${st.coolNote || ' (the plan does not wait for it to cool after the fire is out)'}`));
      else add(deadHeadingCaution(where));
    }
    stalled = dead;
    const relieved = loop.loop === 'open' || loop.relief === 'relief-valve' || (loop.relief === 'open-vent' && !st.closed.has('vent'));
    if (heated && !relieved && !unrelieved) add(closedLoopNoReliefCaution(where));
    unrelieved = heated && !relieved;
  });
  if (st.fireLit) out.push({ ...planEndsLitCaution(`step ${steps.length} (the end of the plan)`), step: steps.length });
  return out;
}
