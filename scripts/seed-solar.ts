/**
 * The demo lab's solar collector (fixtures/demo-solar.ts): its rig and a measured-day study, in
 * the demo's transaction; its logged day (`solarDemoLog`) is imported afterwards by scripts/seed.ts
 * through the import a user's upload goes through, so its trials are the log's steady periods.
 */
import type { EntityManager } from '@mikro-orm/postgresql';
import { Rig, Study, type LabRow, type UserRow } from '../entities';
import { SOLAR_LOG_FILENAME, SOLAR_LOG_MAPPING, solarLogCsv, solarMeasuredDay, solarRig } from '../fixtures/demo-solar';

/** The rig and the study (written by the demo engineer, so the study page names its author). */
export function seedSolarDemo(tx: EntityManager, lab: LabRow, engineer: UserRow): void {
  tx.create(Rig, { lab, ...solarRig });
  tx.create(Study, {
    lab,
    createdBy: engineer,
    updatedBy: engineer,
    title: 'Garage roof collector: a measured day',
    blocks: [
      { id: 'solar-intro', kind: 'text', data: { markdown: 'The collector test of **Garage Roof Collector** is on its rig page: its logged day, the steady periods found in it, and *Collector efficiency*. Below: the pool it heats on a sunny day, forecast from the morning temperature with the pump hours and the weather, against the evening reading.' } },
      { id: 'solar-day', kind: 'forecast', data: { ...solarMeasuredDay } },
      { id: 'solar-caution', kind: 'caution', data: {} },
    ],
  });
}

/** The collector's logged day, imported with the ISO 9806 ("collector") steadiness preset. */
export const solarDemoLog = { rig: solarRig.name, filename: SOLAR_LOG_FILENAME, csv: solarLogCsv, mapping: SOLAR_LOG_MAPPING, preset: 'collector' as const };
