/**
 * The Plans sheet and a step in words: the demo plan (fixtures/demo-plan.ts) with the cautions of
 * the checker (analysis/safety/operating-plan.ts; DOMAIN.md §5, common practice), in SI and US
 * units. 12 L/min = 3.170 gpm with the exact US gallon of NIST SP 811 (3.785411784 L).
 */
import { describe, expect, test } from 'vitest';
import { planSheet } from '@/app/_lib/exports/plan-sheet';
import { checkOperatingPlan, stepText } from '@/app/_contracts/operating-plan';
import { CAUTION_DEFER } from '@/analysis/safety/cautions';
import { demoPlan } from '@/fixtures/demo-plan';

describe('a step in words', () => {
  test.each([
    [{ kind: 'flow-set', flowM3PerS: 12 / 60000 }, 'si', 'Set the flow to 12.0 L/min'],
    [{ kind: 'flow-set', flowM3PerS: 12 / 60000 }, 'us', 'Set the flow to 3.17 gpm'], // NIST SP 811: 1 gal = 3.785411784 L
    [{ kind: 'wait-until-cold', coilBelowC: 35 }, 'us', 'Keep pumping until the coil is below 95 °F'], // 35 °C = 95 °F exactly
    [{ kind: 'valve-closed', valve: 'return' }, 'si', 'Close the return valve (from the coil)'],
    [{ kind: 'wait', minutes: 90 }, 'si', 'Wait 90 min'],
  ] as const)('%j in %s → %s', (step, units, text) => expect(stepText(step, units)).toBe(text));
});

describe('the Plans sheet', () => {
  test('the safe demo plan: one row for the loop and one per step, no caution, the deferral in the notice', () => {
    const sheet = planSheet([{ ...demoPlan, rigName: demoPlan.rig, cautions: checkOperatingPlan(demoPlan.steps, demoPlan.loop) }], 'si');
    expect(sheet.name).toBe('Plans');
    expect(sheet.rows).toHaveLength(1 + demoPlan.steps.length);
    expect(sheet.rows[0]).toMatchObject({ step: null, caution: 'none' });
    expect(sheet.rows.slice(1).every((r) => r.caution === null)).toBe(true);
    expect(sheet.notice).toContain(CAUTION_DEFER);
  });
  test('a hazard is named at its step and in the notice rows', () => {
    const steps = [{ kind: 'fire-lit' as const }, ...demoPlan.steps.filter((s) => s.kind !== 'fire-lit')];
    const sheet = planSheet([{ name: 'Bad order', rigName: 'Coil', steps, loop: demoPlan.loop, cautions: checkOperatingPlan(steps, demoPlan.loop) }], 'us');
    expect(sheet.rows[1]).toMatchObject({ step: 1, action: 'Light the fire' });
    expect(String(sheet.rows[1].caution)).toMatch(/^Danger: Step 1 \(fire lit\): the fire is lit before water flows/);
    expect(sheet.notice!.some((l) => l.startsWith('Bad order: Danger: Step 1 (fire lit)'))).toBe(true);
  });
});
