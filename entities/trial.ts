import { defineEntity, p } from '@mikro-orm/core';
import { baseProperties, num } from './base';
import { Lab } from './lab';
import { Rig } from './rig';

/**
 * One steady trial of a rig: a flow and the inlet and outlet temperatures it produced.
 * Everything is stored in SI: m³, s, m³/s, °C. `lab` is denormalised from the rig so that every
 * query can be scoped to a lab without a join.
 */
export const Trial = defineEntity({
  name: 'Trial',
  tableName: 'trial',
  indexes: [{ properties: ['rig', 'startedAt'] }],
  properties: {
    ...baseProperties(),
    lab: () => p.manyToOne(Lab).deleteRule('cascade'),
    rig: () => p.manyToOne(Rig).deleteRule('cascade'),
    startedAt: p.datetime().columnType('timestamptz'),
    /** Bucket volume in m³ when the flow was timed with a bucket. */
    bucketVolumeM3: num().nullable(),
    /** One or more fill times of that bucket, in s. */
    fillTimesS: p.json<number[]>().nullable(),
    /** Volume flow in m³/s (from the bucket or a meter). */
    flowM3PerS: num().fieldName('flow_m3_per_s'),
    inletC: num(),
    outletC: num(),
    ambientC: num().nullable(),
    /** Marks a repeated reference flow used to detect drift. */
    isReference: p.boolean().default(false),
    excluded: p.boolean().default(false),
    notes: p.text().default(''),
  },
});
