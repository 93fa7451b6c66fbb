import { defineEntity, p } from '@mikro-orm/core';
import { baseProperties } from './base';
import { Lab } from './lab';
import { Rig } from './rig';
import { SourceFile } from './source-file';
import { User } from './user';

export const IMPORT_JOB_STATES = ['queued', 'running', 'completed', 'failed', 'cancelled'] as const;
export type ImportJobState = (typeof IMPORT_JOB_STATES)[number];

/**
 * A sensor-log import run in the background (pg-boss queue `sensor-import`; the pg-boss job has
 * the same id). The worker writes its progress here, outside the import's own transaction, and
 * reads `cancelRequested` between batches. `input` is the confirmed mapping and criteria.
 */
export const ImportJob = defineEntity({
  name: 'ImportJob',
  tableName: 'import_job',
  // the lab's job list, and a rig's page (its recent imports)
  indexes: [{ properties: ['lab', 'createdAt'] }, { properties: ['rig', 'createdAt'] }],
  properties: {
    ...baseProperties(),
    lab: () => p.manyToOne(Lab).deleteRule('cascade'),
    rig: () => p.manyToOne(Rig).deleteRule('cascade'),
    sourceFile: () => p.manyToOne(SourceFile).deleteRule('cascade'),
    createdBy: () => p.manyToOne(User).nullable().deleteRule('set null'),
    state: p.enum(() => [...IMPORT_JOB_STATES]).default('queued').$type<ImportJobState>(),
    input: p.json<Record<string, unknown>>(),
    /** Bytes of the file read so far, and its size. */
    bytesDone: p.bigint('number').$type<number>().default(0),
    bytesTotal: p.bigint('number').$type<number>().default(0),
    rowsDone: p.integer().default(0),
    /** How many times a worker has started this job (a restart of the web process starts it again). */
    attempts: p.integer().default(0),
    cancelRequested: p.boolean().default(false),
    result: p.json<Record<string, unknown>>().nullable(),
    error: p.text().nullable(),
    startedAt: p.datetime().columnType('timestamptz').nullable(),
    finishedAt: p.datetime().columnType('timestamptz').nullable(),
  },
});
