import { defineEntity, p } from '@mikro-orm/core';
import { baseProperties } from './base';

/** The unit system a lab or a user prefers for display; numbers are always stored in SI. */
export const UNIT_SYSTEMS = ['si', 'us'] as const;
export type UnitSystem = (typeof UNIT_SYSTEMS)[number];

/** A lab: the team that owns rigs, trials, fits and studies. Every record belongs to one lab. */
export const Lab = defineEntity({
  name: 'Lab',
  tableName: 'lab',
  properties: {
    ...baseProperties(),
    name: p.string().length(120),
    slug: p.string().length(80).unique(),
    unitSystem: p.enum(() => [...UNIT_SYSTEMS]).default('si').$type<UnitSystem>(),
    isDemo: p.boolean().default(false),
  },
});
