import { defineEntity, p } from '@mikro-orm/core';
import { num } from './base';
import { Rig } from './rig';
import { SourceFile } from './source-file';

/**
 * One row of a sensor log (1 Hz or faster), written with COPY. No uuid per row: the key is the
 * source file and the row's position in it, which also links the row back to its line.
 */
export const SensorSample = defineEntity({
  name: 'SensorSample',
  tableName: 'sensor_sample',
  indexes: [{ properties: ['rig', 'takenAt'] }],
  properties: {
    sourceFile: () => p.manyToOne(SourceFile).primary().deleteRule('cascade'),
    line: p.integer().primary(),
    rig: () => p.manyToOne(Rig).deleteRule('cascade'),
    takenAt: p.datetime().columnType('timestamptz'),
    inletC: num().nullable(),
    outletC: num().nullable(),
    flowM3PerS: num().fieldName('flow_m3_per_s').nullable(),
    ambientC: num().nullable(),
  },
});
