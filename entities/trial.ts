import { defineEntity, p } from '@mikro-orm/core';
import { baseProperties, num } from './base';
import { Lab } from './lab';
import { Rig } from './rig';
import { SourceFile } from './source-file';
import { TestSession } from './test-session';

/**
 * One steady trial of a rig: a flow and the inlet and outlet temperatures it produced.
 * Everything is stored in SI: m³, s, m³/s, °C. `lab` is denormalised from the rig so that every
 * query can be scoped to a lab without a join.
 */
export const Trial = defineEntity({
  name: 'Trial',
  tableName: 'trial',
  indexes: [{ properties: ['rig', 'startedAt'] }, { properties: ['session'] }],
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
    inletTempC: num().fieldName('inlet_c'),
    outletTempC: num().fieldName('outlet_c'),
    ambientTempC: num().fieldName('ambient_c').nullable(),
    /** Irradiance in the collector plane, W/m² (solar-collector trials). */
    irradianceWPerM2: num().fieldName('irradiance_w_per_m2').nullable(),
    /** Wind over the collector, m/s. */
    windMPerS: num().fieldName('wind_m_per_s').nullable(),
    /** Marks a repeated reference flow used to detect drift. */
    isReference: p.boolean().default(false),
    excluded: p.boolean().default(false),
    notes: p.text().default(''),
    /** How the trial came in: a row of a trial sheet, a steady segment of a sensor log, or typed at the rig. */
    origin: p.enum(() => ['sheet', 'log-segment', 'manual', 'api', 'demo'] as const).default('manual').$type<'sheet' | 'log-segment' | 'manual' | 'api' | 'demo'>(),
    sourceFile: () => p.manyToOne(SourceFile).nullable().deleteRule('set null'),
    /** 1-based line of the source file (first line of the segment for logs). */
    sourceLine: p.integer().nullable(),
    /** Steady-state criteria and statistics used when the trial was cut from a log. */
    segment: p.json<Record<string, unknown>>().nullable(),
    /** The test session whose reading or steady period this trial is. */
    session: () => p.manyToOne(TestSession).nullable().deleteRule('set null'),
  },
});
