import { defineEntity, p } from '@mikro-orm/core';
import { baseProperties } from './base';
import { Lab } from './lab';
import type { RigDetails } from '../analysis/performance/rig-details';

export const HEAT_SOURCES = ['wood-fire', 'propane-burner', 'natural-gas', 'solar-collector', 'electric', 'heat-pump', 'other'] as const;
export type HeatSource = (typeof HEAT_SOURCES)[number];

/** Free-form construction details of a rig (coil or collector), stored as JSON: the shape is declared once in analysis. */
export type { RigDetails };

/** A heater set-up under test. Trials belong to a rig; a rig belongs to a lab. */
export const Rig = defineEntity({
  name: 'Rig',
  tableName: 'rig',
  uniques: [{ properties: ['lab', 'name'] }],
  properties: {
    ...baseProperties(),
    lab: () => p.manyToOne(Lab).deleteRule('cascade'),
    name: p.string().length(120),
    heatSource: p.enum(() => [...HEAT_SOURCES]).$type<HeatSource>(),
    description: p.text().default(''),
    details: p.json<RigDetails>().default('{}'),
    notes: p.text().default(''),
  },
});
