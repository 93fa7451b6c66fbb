import { defineEntity, p } from '@mikro-orm/core';
import { baseProperties } from './base';
import { Lab } from './lab';
import { Rig } from './rig';
import { User } from './user';
import type { LoopFacts, OperatingStep } from '../analysis/safety/operating-plan';

/**
 * An operating plan of a rig: its name, the ordered steps of running it (pump, valves, flow, fire,
 * waits, cover; SI) and the loop's facts (open or closed, the relief path). The cautions are never
 * stored: `checkOperatingPlan` (analysis/safety/operating-plan.ts) raises them whenever it is read.
 */
export const OperatingPlan = defineEntity({
  name: 'OperatingPlan',
  tableName: 'operating_plan',
  indexes: [{ properties: ['rig', 'createdAt'] }],
  properties: {
    ...baseProperties(),
    lab: () => p.manyToOne(Lab).deleteRule('cascade'),
    rig: () => p.manyToOne(Rig).deleteRule('cascade'),
    createdBy: () => p.manyToOne(User).nullable().deleteRule('set null'),
    name: p.string().length(120),
    steps: p.json<OperatingStep[]>(),
    loop: p.json<LoopFacts>(),
  },
});
