/**
 * The operating-plan checker against the safety practice of DOMAIN.md §5 ("start flow before
 * lighting and keep it until the coil is cold", "never valve off both ends of a heated coil; keep
 * an open, unvalved vent or relief path", "warn when a test plan includes a closed-valve or
 * zero-flow step"). The hazards themselves are common practice; local codes have the last word.
 */
import { describe, expect, test } from 'vitest';
import { checkOperatingPlan, type LoopFacts, type OperatingStep } from '../../../analysis/safety/operating-plan';
import { CAUTION_DEFER } from '../../../analysis/safety/cautions';
import { planCautions } from '../../../analysis/safety/plan-check';

const open: LoopFacts = { loop: 'open', relief: 'none' };
const closedWithValve: LoopFacts = { loop: 'closed', relief: 'relief-valve' };

/** The safe order (common practice): flow first, fire, fire out, pump until cold, pump off. */
const SAFE: OperatingStep[] = [
  { kind: 'cover-off' },
  { kind: 'valve-open', valve: 'supply' },
  { kind: 'valve-open', valve: 'return' },
  { kind: 'pump-on' },
  { kind: 'flow-set', flowM3PerS: 12 / 60000 },
  { kind: 'fire-lit' },
  { kind: 'wait', minutes: 90 },
  { kind: 'fire-out' },
  { kind: 'wait-until-cold', coilBelowC: 35 },
  { kind: 'pump-off' },
  { kind: 'cover-on' },
];

const codes = (steps: OperatingStep[], loop: LoopFacts = open) => checkOperatingPlan(steps, loop).map((c) => [c.code, c.step]);

describe('operating plan: a safe plan (common practice)', () => {
  test('flow before fire, fire out, pump until the coil is cold: no caution, open or closed with a relief valve', () => {
    expect(checkOperatingPlan(SAFE, open)).toEqual([]);
    expect(checkOperatingPlan(SAFE, closedWithValve)).toEqual([]);
    expect(checkOperatingPlan(SAFE, { loop: 'closed', relief: 'open-vent' })).toEqual([]);
  });
  test('an empty plan raises nothing', () => expect(checkOperatingPlan([], open)).toEqual([]));
});

describe('operating plan: each hazard at the step where it begins (DOMAIN.md §5)', () => {
  test('the fire lit before the pump is a danger at the fire step; the later pump start raises nothing more', () => {
    const c = checkOperatingPlan([{ kind: 'fire-lit' }, { kind: 'pump-on' }, { kind: 'fire-out' }, { kind: 'wait-until-cold', coilBelowC: 30 }, { kind: 'pump-off' }], open);
    expect(c.map((x) => [x.code, x.step, x.level])).toEqual([['pump-after-fire', 1, 'danger']]);
    expect(c[0].where).toBe('step 1 (fire lit)');
  });
  test('a closed supply or return valve, or a flow of zero, while the fire burns is dead-heading', () => {
    const lit: OperatingStep[] = [{ kind: 'pump-on' }, { kind: 'fire-lit' }];
    const end: OperatingStep[] = [{ kind: 'fire-out' }, { kind: 'wait-until-cold', coilBelowC: 30 }, { kind: 'pump-off' }];
    expect(codes([...lit, { kind: 'valve-closed', valve: 'return' }, { kind: 'valve-open', valve: 'return' }, ...end])).toEqual([['dead-heading', 3]]);
    expect(codes([...lit, { kind: 'flow-set', flowM3PerS: 0 }, ...end])).toEqual([['dead-heading', 3]]);
    // a bypass valve is not in the coil's path
    expect(codes([...lit, { kind: 'valve-closed', valve: 'bypass' }, ...end])).toEqual([]);
  });
  test('lighting the fire against a closed valve is the fire lit before water flows', () => {
    expect(codes([{ kind: 'valve-closed', valve: 'supply' }, { kind: 'pump-on' }, { kind: 'fire-lit' }])).toEqual([['pump-after-fire', 3], ['plan-ends-lit', 3]]);
  });
  test('a closed loop heated with no relief path is a danger; closing the vent of an open-vent loop while hot is too', () => {
    expect(codes(SAFE, { loop: 'closed', relief: 'none' })).toEqual([['closed-loop-no-relief', 6]]);
    const vented = [...SAFE.slice(0, 7), { kind: 'valve-closed', valve: 'vent' } as OperatingStep, ...SAFE.slice(7)];
    expect(codes(vented, { loop: 'closed', relief: 'open-vent' })).toEqual([['closed-loop-no-relief', 8]]);
    // cold again before the vent is closed: no caution
    expect(codes([...SAFE, { kind: 'valve-closed', valve: 'vent' }], { loop: 'closed', relief: 'open-vent' })).toEqual([]);
  });
  test('the pump stopped while the fire burns, or after fire out without waiting for the coil to cool', () => {
    const start: OperatingStep[] = [{ kind: 'pump-on' }, { kind: 'fire-lit' }];
    const lit = checkOperatingPlan([...start, { kind: 'pump-off' }, { kind: 'fire-out' }], open);
    expect(lit.map((x) => [x.code, x.step])).toEqual([['pump-stopped-hot', 3]]);
    expect(lit[0].message).toMatch(/the fire is still lit/);
    const hot = checkOperatingPlan([...start, { kind: 'fire-out' }, { kind: 'wait', minutes: 5 }, { kind: 'pump-off' }], open);
    expect(hot.map((x) => [x.code, x.step])).toEqual([['pump-stopped-hot', 5]]);
    expect(hot[0].message).toMatch(/does not wait for it to cool/);
  });
  test('waiting only until the coil is below 60 °C does not make it cold (49 °C scald threshold, DOMAIN.md §5)', () => {
    const c = checkOperatingPlan([{ kind: 'pump-on' }, { kind: 'fire-lit' }, { kind: 'fire-out' }, { kind: 'wait-until-cold', coilBelowC: 60 }, { kind: 'pump-off' }], open);
    expect(c.map((x) => x.code)).toEqual(['pump-stopped-hot']);
    expect(c[0].message).toMatch(/below 60 °C, not below the 49 °C scald threshold/);
    expect(codes([{ kind: 'pump-on' }, { kind: 'fire-lit' }, { kind: 'fire-out' }, { kind: 'wait-until-cold', coilBelowC: 48 }, { kind: 'pump-off' }])).toEqual([]);
  });
  test('waiting for the coil to cool with the fire still lit does not cool it', () => {
    expect(codes([{ kind: 'pump-on' }, { kind: 'fire-lit' }, { kind: 'wait-until-cold', coilBelowC: 30 }, { kind: 'pump-off' }, { kind: 'fire-out' }])).toEqual([['pump-stopped-hot', 4]]);
  });
  test('a plan that ends with the fire lit is a warning at its last step', () => {
    const c = checkOperatingPlan([{ kind: 'pump-on' }, { kind: 'fire-lit' }], open);
    expect(c.map((x) => [x.code, x.step, x.level])).toEqual([['plan-ends-lit', 2, 'warning']]);
  });
  test('every caution defers to local codes and licensed practice', () => {
    const all = checkOperatingPlan([{ kind: 'fire-lit' }, { kind: 'pump-on' }, { kind: 'pump-off' }], { loop: 'closed', relief: 'none' });
    expect(all.map((x) => x.code).sort()).toEqual(['closed-loop-no-relief', 'plan-ends-lit', 'pump-after-fire', 'pump-stopped-hot']);
    for (const c of all) expect(c.message).toContain(CAUTION_DEFER);
  });
});

describe('operating plan: malformed input names the step and field', () => {
  test.each([
    [[{ kind: 'flow-set', flowM3PerS: -1 }], /steps\[0\]\.flowM3PerS/],
    [[{ kind: 'pump-on' }, { kind: 'valve-closed', valve: 'drain' }], /steps\[1\]\.valve/],
    [[{ kind: 'wait', minutes: Number.NaN }], /steps\[0\]\.minutes/],
    [[{ kind: 'wait-until-cold' }], /steps\[0\]\.coilBelowC/],
    [[{ kind: 'boil' }], /steps\[0\]\.kind/],
  ])('%j', (steps, re) => expect(() => checkOperatingPlan(steps as OperatingStep[], open)).toThrow(re));
  test('bad loop facts are a TypeError', () => expect(() => checkOperatingPlan([], { loop: 'sealed', relief: 'none' } as never)).toThrow(/loop/));
});

describe('one dead-heading rule: planCautions and the operating plan agree', () => {
  test('a heated step with no flow is dead-heading in both', () => {
    expect(planCautions([{ flowM3PerS: 0 }]).map((c) => c.code)).toEqual(['dead-heading']);
    expect(codes([{ kind: 'pump-on' }, { kind: 'fire-lit' }, { kind: 'flow-set', flowM3PerS: 0 }]).map((x) => x[0])).toEqual(['dead-heading', 'plan-ends-lit']);
  });
});

describe('operating-plan caution wording', () => {
  test('no message doubles a word, and each starts with the step it names (common practice of our own wording)', () => {
    const all = checkOperatingPlan([{ kind: 'fire-lit' }, { kind: 'pump-on' }, { kind: 'flow-set', flowM3PerS: 0 }, { kind: 'flow-set', flowM3PerS: 1e-4 }, { kind: 'pump-off' }], { loop: 'closed', relief: 'none' });
    expect(new Set(all.map((c) => c.code)).size).toBe(5);
    for (const c of all) {
      expect(c.message, c.message).not.toMatch(/\b(\w+)\s+\1\b/i);
      expect(c.message.startsWith(`Step ${c.step} (`)).toBe(true);
    }
  });
});
