import { defineEntity, p } from '@mikro-orm/core';
import { baseProperties } from './base';
import { Lab } from './lab';
import { REVIEW_STATES, type ReviewState } from './review';
import { Rig } from './rig';
import { User } from './user';

export const FIT_KINDS = ['heater', 'collector'] as const;
export type FitKind = (typeof FIT_KINDS)[number];

/**
 * A saved fit: an immutable record of the trials used (ids and a hash of their values), the
 * model, the settings, the results and the software version. Refitting makes a new version
 * (`version` + 1, `previous` pointing back); only the review state changes afterwards.
 */
export const Fit = defineEntity({
  name: 'Fit',
  tableName: 'fit',
  uniques: [{ properties: ['rig', 'title', 'version'] }],
  indexes: [{ properties: ['lab', 'createdAt'] }],
  properties: {
    ...baseProperties(),
    lab: () => p.manyToOne(Lab).deleteRule('cascade'),
    rig: () => p.manyToOne(Rig).deleteRule('cascade'),
    createdBy: () => p.manyToOne(User).nullable().deleteRule('set null'),
    title: p.string().length(160),
    version: p.integer().default(1),
    previous: () => p.manyToOne(Fit).nullable().deleteRule('set null'),
    /** What the fit models: a heater's outlet against flow, or a solar collector's efficiency curve (ISO 9806). */
    kind: p.enum(() => [...FIT_KINDS]).default('heater').$type<FitKind>(),
    model: p.string().length(400),
    trialIds: p.json<string[]>(),
    trialsHash: p.string().length(64),
    settings: p.json<Record<string, unknown>>(),
    result: p.json<Record<string, unknown>>(),
    softwareVersion: p.string().length(40),
    reviewState: p.enum(() => [...REVIEW_STATES]).default('draft').$type<ReviewState>(),
  },
});
