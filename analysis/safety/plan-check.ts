/**
 * Checks a test plan (a list of steps) for dead-heading: a step with zero flow or a closed valve
 * while the coil is heated. The rule itself, {@link coilDeadHeaded}, is the one the operating-plan
 * checker (operating-plan.ts) applies to each state of an ordered plan (DOMAIN.md §5; common practice).
 */
import { deadHeadingCaution, type Caution } from './cautions';

/** What decides whether water moves through the coil at one moment of a plan. */
export interface CoilFlowState {
  /** the fire or burner is lit, or the coil is still hot from it */
  heated: boolean;
  /** the pump runs */
  pumpOn: boolean;
  /** the flow set, m³/s (null: not stated, the pump's own flow) */
  flowM3PerS: number | null;
  /** a valve between the pump and an open outlet is closed */
  pathClosed: boolean;
}

/**
 * The one dead-heading rule: a heated (or still hot) coil through which no water moves — the pump
 * off, a flow of zero or a closed valve in the path.
 * @example coilDeadHeaded({ heated: true, pumpOn: true, flowM3PerS: 0, pathClosed: false }) // true
 */
export function coilDeadHeaded(s: CoilFlowState): boolean {
  return s.heated && (!s.pumpOn || (s.flowM3PerS !== null && s.flowM3PerS <= 0) || s.pathClosed);
}

/** One step of a test plan. */
export interface PlanStep {
  label?: string;
  /** planned volume flow, m³/s */
  flowM3PerS: number;
  /** is the fire or burner lit during the step (default true) */
  heated?: boolean;
  /** is any valve between the pump and an open outlet closed */
  valveClosed?: boolean;
}

/**
 * @returns one dead-heading caution per offending step (none for a safe plan)
 * @throws TypeError when a step's flow is not a finite number.
 * @example planCautions([{ flowM3PerS: 1e-4 }, { flowM3PerS: 0 }])[0].where // 'step 2'
 */
export function planCautions(steps: PlanStep[]): Caution[] {
  if (!Array.isArray(steps)) throw new TypeError('steps must be an array');
  const out: Caution[] = [];
  steps.forEach((s, i) => {
    if (typeof s?.flowM3PerS !== 'number' || !Number.isFinite(s.flowM3PerS)) {
      throw new TypeError(`steps[${i}].flowM3PerS must be a finite number, got ${String(s?.flowM3PerS)}`);
    }
    const state = { heated: s.heated !== false, pumpOn: true, flowM3PerS: s.flowM3PerS, pathClosed: s.valveClosed === true };
    if (coilDeadHeaded(state)) out.push(deadHeadingCaution(s.label ?? `step ${i + 1}`));
  });
  return out;
}
