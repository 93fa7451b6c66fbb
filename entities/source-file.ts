import { defineEntity, p } from '@mikro-orm/core';
import { baseProperties } from './base';
import { Lab } from './lab';
import { Rig } from './rig';
import { User } from './user';

export const SOURCE_FILE_STATES = ['uploaded', 'imported', 'failed'] as const;

/**
 * A raw file as uploaded (trial sheet, sensor log or rig photo), kept unchanged in object
 * storage under `storageKey`. The SHA-256 recognises the same file uploaded twice in a lab.
 */
export const SourceFile = defineEntity({
  name: 'SourceFile',
  tableName: 'source_file',
  uniques: [{ properties: ['lab', 'sha256', 'purpose'] }],
  // a rig's page lists its sheets, logs and photos, newest first
  indexes: [{ properties: ['rig', 'purpose', 'createdAt'] }],
  properties: {
    ...baseProperties(),
    lab: () => p.manyToOne(Lab).deleteRule('cascade'),
    rig: () => p.manyToOne(Rig).nullable().deleteRule('set null'),
    uploadedBy: () => p.manyToOne(User).nullable().deleteRule('set null'),
    purpose: p.enum(() => ['trials', 'photo'] as const).default('trials').$type<'trials' | 'photo'>(),
    filename: p.string().length(255),
    contentType: p.string().length(120).default('application/octet-stream'),
    sizeBytes: p.bigint('number').$type<number>(),
    sha256: p.string().length(64),
    storageKey: p.string().length(300),
    state: p.enum(() => [...SOURCE_FILE_STATES]).default('uploaded').$type<(typeof SOURCE_FILE_STATES)[number]>(),
    /** Rows written from this file, when imported. */
    rowsImported: p.integer().default(0),
  },
});
