import { defineEntity, p } from '@mikro-orm/core';
import { UNIT_SYSTEMS, type UnitSystem } from '../analysis/units/unit-system';
import { baseProperties } from './base';

/** A lab: the team that owns rigs, trials, fits and studies. Every record belongs to one lab. */
export const Lab = defineEntity({
  name: 'Lab',
  tableName: 'lab',
  properties: {
    ...baseProperties(),
    name: p.string().length(120),
    slug: p.string().length(80).unique(),
    /** the unit system the lab prefers for display; numbers are always stored in SI */
    unitSystem: p.enum(() => [...UNIT_SYSTEMS]).default('si').$type<UnitSystem>(),
    isDemo: p.boolean().default(false),
  },
});
