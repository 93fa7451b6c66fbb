/**
 * Safety in every export, from the one set of rules in analysis/safety: the notice rows at the
 * head of each sheet (XLSX) or the `#` comment lines at the head of each CSV, one caution per
 * hazard and place the sheet reaches, the Caution cell that says in words why a row's temperature
 * is marked, and the limits with their meaning for the Summary.
 */
import { CAUTION_DEFER, cautionsToShow, HAZARD_BANDS, hazardBand, hottestCautions, thresholdText, type CautionLike, type PlaceTemperatures } from '@/analysis/safety/cautions';
import { CAUTION_LIMITS, STANDING_NOTICE } from '@/analysis/safety/standing-notice';
import type { UnitSystem } from '@/analysis/units/unit-system';
import { displayUnit } from '@/app/_contracts/units';
import type { SummaryItem } from './xlsx';

/** The first notice row of every sheet that shows temperatures: the limits in the reader's units. */
export function limitsLine(system: UnitSystem): string {
  const both = (c: number) => (system === 'us' ? `${thresholdText(c, 'us')} (${thresholdText(c)})` : `${thresholdText(c)} (${thresholdText(c, 'us')})`);
  const words = [...HAZARD_BANDS].reverse().map((b) => `${both(b.thresholdC)} ${b.short}`);
  return `Safety: temperatures at or above ${words.join(' / ')} are marked in the Caution column.`;
}

/** One line per caution (worst first, each once), without the shared closing sentence; `prefix` names whose it is. */
export function cautionLines(cautions: readonly CautionLike[], prefix = ''): string[] {
  return cautionsToShow(cautions).map((c) => `${prefix}${c.level === 'danger' ? 'Danger' : 'Warning'}: ${c.message.replace(CAUTION_DEFER, '').trim()}`);
}

/**
 * The notice rows of a sheet: the limits, one caution per hazard and place reached by the given
 * temperatures, and the analysis-aid sentence.
 * @param places the temperatures the sheet shows, by place, °C (none: only the limits and the notice)
 */
export function sheetNotice(system: UnitSystem, places: readonly PlaceTemperatures[] = [], extra: readonly string[] = []): string[] {
  return [limitsLine(system), ...extra, ...cautionLines(hottestCautions(places, system)), CAUTION_DEFER];
}

/**
 * The Caution cell of a row: the place and band of its hottest marked temperature in words, e.g.
 * "outlet at or above 60 °C: burns in seconds"; null when every value is below 40 °C.
 * @example cautionCell([['inlet', 18], ['outlet', 52]], 'si') // 'outlet at or above 49 °C: can scald'
 */
export function cautionCell(values: readonly [string, number | null | undefined][], system: UnitSystem): string | null {
  let top: [string, number] | null = null;
  for (const [where, c] of values) if (typeof c === 'number' && Number.isFinite(c) && (top === null || c > top[1])) top = [where, c];
  if (!top) return null;
  const h = hazardBand(top[1], system);
  return h.band === 'none' ? null : `${top[0]} ${h.label}`;
}

/** The caution limits of the Summary: each threshold in the display unit, its meaning and basis. */
export function limitItems(system: UnitSystem): SummaryItem[] {
  const temp = displayUnit('temperature', system);
  return CAUTION_LIMITS.map((l) => ({
    section: 'Safety limits',
    key: `${l.meaning} (${l.basis})`,
    // whole degrees, as thresholdText (analysis/safety) writes them
    value: Math.round(temp.from(l.thresholdC)),
    unit: temp.label,
  }));
}

/** The standing notice, for the notes of a Summary. */
export const STANDING_NOTES: readonly string[] = STANDING_NOTICE;
