/**
 * An operating plan read-only: its steps in order (a step where a caution arises is marked, its
 * level in words), the loop's facts and the caution list with the standing deferral to local
 * codes. Plain component without hooks: the rig page, its form and the study block share it.
 */
import { CautionList } from './safety-notice';
import { CAUTION_DEFER } from '@/analysis/safety/cautions';
import { LOOP_LABELS, RELIEF_LABELS, stepText, type OperatingPlanDto } from '../_contracts/operating-plan';
import type { UnitSystem } from '@/analysis/units/unit-system';

export function OperatingPlanView({ plan, units, label = 'Cautions of this plan' }: { plan: Pick<OperatingPlanDto, 'steps' | 'loop' | 'cautions'>; units: UnitSystem; label?: string }) {
  const worst = (i: number) => {
    const at = plan.cautions.filter((c) => c.step === i + 1);
    return at.some((c) => c.level === 'danger') ? 'danger' : at.length ? 'warning' : null;
  };
  return (
    <div className="space-y-3">
      <p className="text-sm text-ink-soft">
        {LOOP_LABELS[plan.loop.loop]}; {RELIEF_LABELS[plan.loop.relief].toLowerCase()}.
      </p>
      <ol className="space-y-1 text-sm" aria-label="Steps">
        {plan.steps.map((s, i) => {
          const w = worst(i);
          return (
            <li key={i} className="flex flex-wrap items-baseline gap-2" data-step-caution={w ?? undefined}>
              <span className="num w-6 shrink-0 text-right text-ink-muted">{i + 1}.</span>
              <span>{stepText(s, units)}</span>
              {w ? (
                <span className={`rounded px-1 text-xs font-semibold ring-1 ${w === 'danger' ? 'bg-danger-bg text-danger-text ring-danger-line' : 'bg-caution-bg text-caution-text ring-caution-line'}`}>
                  {w === 'danger' ? 'danger' : 'warning'}: see below
                </span>
              ) : null}
            </li>
          );
        })}
      </ol>
      <PlanCautions cautions={plan.cautions} label={label} />
    </div>
  );
}

/** The cautions of a plan with the deferral to local codes, or in words that it raises none. */
export function PlanCautions({ cautions, label = 'Cautions of this plan' }: { cautions: OperatingPlanDto['cautions']; label?: string }) {
  return cautions.length ? (
    <CautionList cautions={cautions} label={label} />
  ) : (
    <p className="text-sm text-ink-soft" data-plan-safe>
      No caution for this order of steps. {CAUTION_DEFER}
    </p>
  );
}
