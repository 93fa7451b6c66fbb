import { defineEntity, p } from '@mikro-orm/core';
import { num } from './base';
import { Rig } from './rig';
import { SourceFile } from './source-file';

/**
 * One row of a sensor log (1 Hz or faster), written with COPY. No uuid per row: the key is the
 * source file and the row's position in it, which also links the row back to its line.
 *
 * The primary key is the table's only index and there are no foreign-key constraints (migration
 * `sensor_sample_storage`): for a million samples PostgreSQL would check the keys row by row at the
 * end of the COPY (about 7 s, more than the COPY itself) and keep a (rig, taken_at) index that no
 * query reads (about 0.7 s). The import locks its source file (FOR UPDATE) and rig (FOR KEY SHARE)
 * in its transaction instead, and triggers delete the samples of a deleted source file or rig.
 * A sample's rig is its source file's rig: the import sets both in one transaction.
 */
export const SensorSample = defineEntity({
  name: 'SensorSample',
  tableName: 'sensor_sample',
  properties: {
    sourceFile: () => p.manyToOne(SourceFile).primary().createForeignKeyConstraint(false),
    line: p.integer().primary(),
    rig: () => p.manyToOne(Rig).createForeignKeyConstraint(false),
    takenAt: p.datetime().columnType('timestamptz'),
    inletC: num().nullable(),
    outletC: num().nullable(),
    flowM3PerS: num().fieldName('flow_m3_per_s').nullable(),
    ambientC: num().nullable(),
  },
});
