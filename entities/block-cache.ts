import { defineEntity, p } from '@mikro-orm/core';
import { baseProperties } from './base';
import { Fit } from './fit';
import { Lab } from './lab';

/**
 * Study block data computed once and kept (app/_lib/studies/block-cache.ts): a saved fit is
 * immutable, so its blocks' numbers and plot SVG depend only on (block kind, fit, version, unit
 * system, view, software version); blocks that read mutable inputs put what they read into their
 * key. Shared by every app instance (an in-process LRU sits in front). Authorization is checked
 * before any read; entries go with their lab and their fit (cascade).
 */
export const BlockCache = defineEntity({
  name: 'BlockCache',
  tableName: 'block_cache',
  properties: {
    ...baseProperties(),
    /** what the value was computed from, in words and ids (at most 400 characters) */
    key: p.string().length(400).unique(),
    lab: () => p.manyToOne(Lab).deleteRule('cascade'),
    /** the saved fit the entry was computed from, when there is one */
    fit: () => p.manyToOne(Fit).nullable().deleteRule('cascade'),
    value: p.json<Record<string, unknown>>(),
  },
});
