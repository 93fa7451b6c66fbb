/**
 * Checks a test plan (a list of steps) for dead-heading: a step with zero flow or a closed valve
 * while the coil is heated, and a heated step without a stated vent or relief path.
 */
import { deadHeadingCaution, type Caution } from './cautions';

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
    const heated = s.heated !== false;
    if (heated && (s.flowM3PerS <= 0 || s.valveClosed === true)) out.push(deadHeadingCaution(s.label ?? `step ${i + 1}`));
  });
  return out;
}
