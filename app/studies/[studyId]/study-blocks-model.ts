/**
 * The blocks of a study as the editor holds them, the kinds it offers with their defaults, and
 * which blocks need their data again after a save.
 */
import type { UnitSystem } from '@/analysis/units/unit-system';

export type Kind = 'text' | 'trials' | 'fit' | 'comparison' | 'performance' | 'forecast' | 'costs' | 'sensor-log' | 'caution' | 'design-comparison'
  // solar collectors
  | 'collector'
  | 'operating-plan'
  | 'tub-fill';
export interface Block {
  id: string;
  kind: Kind;
  data: Record<string, unknown>;
}
export interface StudyState {
  title: string;
  blocks: Block[];
  revision: number;
}

/** The saved fits and imported logs the editor offers. */
export interface EditorChoices {
  fits: { id: string; label: string; coil: boolean; collector?: boolean }[];
  logs: { id: string; label: string }[];
  /** the lab's saved design comparisons */
  comparisons: { id: string; label: string }[];
  /** the lab's operating plans (rig: name) */
  plans: { id: string; label: string }[];
}

export const KINDS: { kind: Kind; label: string }[] = [
  { kind: 'text', label: 'Text' },
  { kind: 'fit', label: 'Fit with plots' },
  { kind: 'comparison', label: 'Model comparison' },
  { kind: 'performance', label: 'Performance table' },
  { kind: 'trials', label: 'Trial table' },
  { kind: 'forecast', label: 'Forecast' },
  { kind: 'costs', label: 'Cost sheet' },
  { kind: 'sensor-log', label: 'Sensor log' },
  { kind: 'caution', label: 'Caution box' },
  { kind: 'design-comparison', label: 'Design comparison' },
  // solar collectors
  { kind: 'collector', label: 'Collector efficiency' },
  { kind: 'operating-plan', label: 'Operating plan' },
  { kind: 'tub-fill', label: 'Tub fill' },
];
export const kindLabel = (k: Kind) => KINDS.find((x) => x.kind === k)?.label ?? k;
export const newBlockId = () => Math.random().toString(36).slice(2, 10);

/** The pool a new forecast or cost sheet starts with, in the reader's units (a 57 m³ backyard pool). */
export const defaultPoolVolume = (units: UnitSystem) => (units === 'us' ? '10000 gal' : '40 m^3');

/**
 * The ids of the blocks whose shown data changes from `before` to `after`: new or edited blocks,
 * and cost sheets that take their heat from an edited forecast block. Moved or deleted blocks
 * need no new data.
 */
export function changedBlocks(before: readonly Block[], after: readonly Block[]): string[] {
  const old = new Map(before.map((b) => [b.id, JSON.stringify([b.kind, b.data])]));
  const changed = new Set(after.filter((b) => old.get(b.id) !== JSON.stringify([b.kind, b.data])).map((b) => b.id));
  for (const b of after) if (b.kind === 'costs' && changed.has(String(b.data.forecastBlockId))) changed.add(b.id);
  return [...changed];
}

/** A new cost sheet: heat from the last forecast block when there is one, else a pool and a rise. Prices are the user's. */
export function costDefaults(units: UnitSystem, forecastBlockId: string | null): Record<string, unknown> {
  return {
    fuel: 'propane',
    price: null,
    currency: 'USD',
    heatFrom: forecastBlockId ? 'forecast' : 'pool',
    ...(forecastBlockId ? { forecastBlockId } : {}),
    poolVolume: defaultPoolVolume(units),
    rise: units === 'us' ? '10 degF' : '5 K',
    heat: units === 'us' ? '100 therm' : '3000 kWh',
  };
}

/** A new forecast: the default pool warmed from 20 to 28 °C (68 to 82 °F) over 48 h with the lab's first coil fit. */
function forecastDefaults(units: UnitSystem, fits: EditorChoices['fits']): Record<string, unknown> {
  const coil = fits.find((f) => f.coil);
  return {
    poolVolume: defaultPoolVolume(units),
    startTemp: units === 'us' ? '68 degF' : '20 degC',
    targetTemp: units === 'us' ? '82 degF' : '28 degC',
    hours: 48,
    flow: units === 'us' ? '3 gpm' : '12 L/min',
    ...(coil ? { fitId: coil.id } : { heater: { model: 'coil', sourceTemp: '88 degC', UA: '430 W/K' } }),
    losses: false,
  };
}

/** The settings a new block of `kind` starts with, after the blocks there are. */
export function newBlockData(kind: Kind, units: UnitSystem, { fits, logs, comparisons, plans }: EditorChoices, blocks: readonly Block[]): Record<string, unknown> {
  switch (kind) {
    case 'forecast':
      return forecastDefaults(units, fits);
    case 'text':
      return { markdown: '' };
    case 'caution':
      return {};
    case 'costs':
      return costDefaults(units, [...blocks].reverse().find((b) => b.kind === 'forecast')?.id ?? null);
    case 'sensor-log':
      return logs[0] ? { sourceFileId: logs[0].id } : {};
    case 'design-comparison':
      return comparisons[0] ? { comparisonId: comparisons[0].id } : {};
    case 'operating-plan':
      return plans[0] ? { planId: plans[0].id } : {};
    case 'tub-fill':
      return tubFillDefaults(units, fits);
    case 'collector': {
      const c = fits.find((f) => f.collector);
      return c ? { fitId: c.id } : {};
    }
    default: {
      const heater = fits.find((f) => !f.collector);
      return heater ? { fitId: heater.id } : {};
    }
  }
}

/** A new tub fill: 1,200 L (300 gal) from a 15 °C (60 °F) supply at 6 L/min (1.5 gpm) through the lab's first coil fit, for 38 °C (100 °F). */
function tubFillDefaults(units: UnitSystem, fits: EditorChoices['fits']): Record<string, unknown> {
  const us = units === 'us';
  const coil = fits.find((f) => f.coil);
  return {
    ...(coil ? { fitId: coil.id } : {}),
    tubVolume: us ? '300 gal' : '1200 L', flow: us ? '1.5 gpm' : '6 L/min', supplyTemp: us ? '60 degF' : '15 degC', targetTemp: us ? '100 degF' : '38 degC',
  };
}
