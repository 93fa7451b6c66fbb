import { defineEntity, p } from '@mikro-orm/core';
import { baseProperties } from './base';
import { Lab } from './lab';
import { User } from './user';

/** What a comparison compares: a rig (every included trial, fitted with `model`) or a saved fit (its own trials and model). */
export interface ComparisonSubject {
  kind: 'rig' | 'fit';
  id: string;
  /** the model a rig's trials are fitted with (default the coil model); a saved fit keeps its own */
  model?: string;
}

/** The common conditions of a comparison, SI. */
export interface ComparisonSettings {
  /** inlet temperature of the heat comparison, °C (default the mean inlet of all trials) */
  inletTempC?: number;
  /** flow of the verdict, m³/s (default the middle of the common flows) */
  flowM3PerS?: number;
}

/**
 * A saved comparison of two or more designs of one lab (rigs or saved fits). It stores what to
 * compare and at which conditions, never the numbers: they are recomputed from the stored trials
 * whenever it is read, so an edited trial shows at once. Comments hang on it by `comment.target_kind`.
 */
export const Comparison = defineEntity({
  name: 'Comparison',
  tableName: 'comparison',
  indexes: [{ properties: ['lab', 'createdAt'] }],
  properties: {
    ...baseProperties(),
    lab: () => p.manyToOne(Lab).deleteRule('cascade'),
    createdBy: () => p.manyToOne(User).nullable().deleteRule('set null'),
    title: p.string().length(160),
    subjects: p.json<ComparisonSubject[]>(),
    settings: p.json<ComparisonSettings>().default('{}'),
  },
});
