import { defineEntity, p } from '@mikro-orm/core';
import { baseProperties } from './base';
import { Lab } from './lab';

/** A confirmed column mapping, saved per lab and offered again when the same headers come back. */
export const ColumnMapping = defineEntity({
  name: 'ColumnMapping',
  tableName: 'column_mapping',
  uniques: [{ properties: ['lab', 'headerSignature'] }],
  properties: {
    ...baseProperties(),
    lab: () => p.manyToOne(Lab).deleteRule('cascade'),
    headerSignature: p.string().length(64),
    headers: p.json<string[]>(),
    mapping: p.json<Record<string, unknown>>(),
  },
});
