/** The demo lab's solar collector (fixtures/demo-solar.ts): its rig, the steady periods of its logged day and a measured-day study. */
import type { EntityManager } from '@mikro-orm/postgresql';
import { Rig, Study, Trial, type LabRow } from '../entities';
import { solarMeasuredDay, solarPeriods, solarRig } from '../fixtures/demo-solar';

export function seedSolarDemo(tx: EntityManager, lab: LabRow): void {
  const rig = tx.create(Rig, { lab, ...solarRig });
  for (const p of solarPeriods()) tx.create(Trial, { lab, rig, origin: 'demo', ...p });
  tx.create(Study, {
    lab,
    title: 'Garage roof collector: a measured day',
    blocks: [
      { id: 'solar-intro', kind: 'text', data: { markdown: 'The collector test of **Garage Roof Collector** is on its rig page (*Collector efficiency*). Below: the pool it heats on a sunny day, forecast from the morning temperature with the pump hours and the weather, against the evening reading.' } },
      { id: 'solar-day', kind: 'forecast', data: { ...solarMeasuredDay } },
      { id: 'solar-caution', kind: 'caution', data: {} },
    ],
  });
}
