/**
 * Operating plans as they cross to the browser: the DTO, the words of each step kind and a step
 * in words in the reader's units. The checker is the one of analysis/safety/operating-plan.ts,
 * re-exported so that the rig page's form raises the same cautions as the server as the user types.
 */
import type { UnitSystem } from '@/analysis/units/unit-system';
import type { CautionLike } from '@/analysis/safety/cautions';
import { checkOperatingPlan, LOOP_KINDS, OPERATING_STEP_KINDS, PLAN_VALVES, RELIEF_KINDS, type LoopFacts, type OperatingStep, type OperatingStepKind, type PlanValve } from '@/analysis/safety/operating-plan';
import { displayUnits, fmt } from './units';

export { checkOperatingPlan, LOOP_KINDS, OPERATING_STEP_KINDS, PLAN_VALVES, RELIEF_KINDS };
export type { LoopFacts, OperatingStep, OperatingStepKind, PlanValve };

/** Most steps in one plan (the API refuses more). */
export const MAX_PLAN_STEPS = 60;

/** A plan as the API answers it: SI steps, the loop and the cautions (with the step where each arises). */
export interface OperatingPlanDto {
  id: string;
  rigId: string;
  rigName: string;
  name: string;
  steps: OperatingStep[];
  loop: LoopFacts;
  cautions: (CautionLike & { step: number })[];
  updatedAt: string;
}

/** The step kinds as a form offers them, with the one quantity each needs. */
export const STEP_KIND_CHOICES: { kind: OperatingStepKind; label: string; field?: 'valve' | 'flow' | 'minutes' | 'coilBelow' }[] = [
  { kind: 'pump-on', label: 'Pump on' },
  { kind: 'pump-off', label: 'Pump off' },
  { kind: 'valve-open', label: 'Open a valve', field: 'valve' },
  { kind: 'valve-closed', label: 'Close a valve', field: 'valve' },
  { kind: 'flow-set', label: 'Set the flow', field: 'flow' },
  { kind: 'fire-lit', label: 'Light the fire' },
  { kind: 'fire-out', label: 'Put the fire out' },
  { kind: 'wait', label: 'Wait', field: 'minutes' },
  { kind: 'wait-until-cold', label: 'Keep pumping until the coil is cold', field: 'coilBelow' },
  { kind: 'cover-on', label: 'Cover on' },
  { kind: 'cover-off', label: 'Cover off' },
];

export const VALVE_LABELS: Record<PlanValve, string> = { supply: 'supply (to the coil)', return: 'return (from the coil)', bypass: 'bypass', vent: 'vent' };
/** A valve in a sentence: 'Open the supply valve (to the coil)'. */
const VALVE_WORDS: Record<PlanValve, string> = { supply: 'supply valve (to the coil)', return: 'return valve (from the coil)', bypass: 'bypass valve', vent: 'vent valve' };
export const LOOP_LABELS: Record<LoopFacts['loop'], string> = { open: 'Open loop (to a pool or tank open to the air)', closed: 'Closed loop (can be shut in)' };
export const RELIEF_LABELS: Record<LoopFacts['relief'], string> = { 'relief-valve': 'Certified relief valve', 'open-vent': 'Open vent (no valve on it)', none: 'No relief path' };

/**
 * One step in words, its quantity in the reader's units.
 * @example stepText({ kind: 'flow-set', flowM3PerS: 2e-4 }, 'si') // 'Set the flow to 12.0 L/min'
 */
export function stepText(s: OperatingStep, units: UnitSystem): string {
  const u = displayUnits(units);
  switch (s.kind) {
    case 'valve-open': return `Open the ${VALVE_WORDS[s.valve ?? 'supply']}`;
    case 'valve-closed': return `Close the ${VALVE_WORDS[s.valve ?? 'supply']}`;
    case 'flow-set': return `Set the flow to ${fmt(u.flow.from(s.flowM3PerS ?? 0))} ${u.flow.label}`;
    case 'wait': return `Wait ${(s.minutes ?? 0).toLocaleString('en-US', { maximumFractionDigits: 1 })} min`;
    case 'wait-until-cold': return `Keep pumping until the coil is below ${u.temp.from(s.coilBelowC ?? 0).toFixed(0)} ${u.temp.label}`;
    default: return STEP_KIND_CHOICES.find((c) => c.kind === s.kind)?.label ?? s.kind;
  }
}
