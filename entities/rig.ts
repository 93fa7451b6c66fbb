import { defineEntity, p } from '@mikro-orm/core';
import { baseProperties } from './base';
import { Lab } from './lab';

export const HEAT_SOURCES = ['wood-fire', 'propane-burner', 'natural-gas', 'solar-collector', 'electric', 'heat-pump', 'other'] as const;
export type HeatSource = (typeof HEAT_SOURCES)[number];

/** Free-form construction details of a rig (coil or collector), stored as JSON. */
export interface RigDetails {
  coilLengthM?: number;
  tubeInnerDiameterM?: number;
  tubeMaterial?: string;
  collectorAreaM2?: number;
  /** solar collectors (app/_lib/rigs/rigs.ts `collectorDetails`) */
  grossAreaM2?: number;
  apertureAreaM2?: number;
  tiltDeg?: number;
  azimuthDeg?: number;
  fluid?: string;
  fluidCpJPerKgK?: number;
  fluidDensityKgPerM3?: number;
  flowPerAreaM3PerSM2?: number;
  /** what the rig cost to build, in `buildCostCurrency` (a code such as "USD") */
  buildCost?: number;
  buildCostCurrency?: string;
  [key: string]: unknown;
}

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
