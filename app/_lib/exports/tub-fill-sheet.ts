/**
 * The Tub fill sheet of a study's tub-fill blocks (app/_lib/forecasts/tub-fill.ts): the tub, the
 * fill flow and supply, the fill time, the heater outlet and the tub when full, the flow for the
 * target, with the safety notice rows of the temperatures it shows (a tub above 40 °C is dangerous).
 */
import type { ExportColumn, ExportRow } from './columns';
import { toDisplay } from '@/app/_contracts/units';
import type { UnitSystem } from '@/analysis/units/unit-system';
import { FMT, quantityColumn } from './quantity-columns';
import type { TubFillExport } from './types';
import type { SheetSpec } from './xlsx';
import { cautionCell, cautionLines, sheetNotice } from './safety';

export function tubFillSheet(fills: readonly TubFillExport[], system: UnitSystem): SheetSpec {
  const t = (key: string, header: string) => quantityColumn(key, header, 'temperature', system);
  const columns: ExportColumn[] = [
    { key: 'block', header: 'Tub fill' }, quantityColumn('volume', 'Tub volume', 'volume', system), quantityColumn('flow', 'Fill flow', 'volumeFlow', system),
    t('supply', 'Supply temperature'), { key: 'fillMin', header: 'Fill time', unit: 'min', numFmt: FMT.hours },
    t('outlet', 'Heater outlet temperature'), t('final', 'Tub temperature when full'), t('target', 'Target temperature'),
    quantityColumn('targetFlow', 'Flow for the target', 'volumeFlow', system), { key: 'targetFillMin', header: 'Fill time at that flow', unit: 'min', numFmt: FMT.hours },
    { key: 'note', header: 'Note' }, { key: 'caution', header: 'Caution' },
  ];
  const rows: ExportRow[] = fills.map(({ label, fill: f }) => ({
    block: label, volume: toDisplay(f.tubVolumeM3, 'volume', system), flow: toDisplay(f.flowM3PerS, 'volumeFlow', system),
    supply: toDisplay(f.supplyTempC, 'temperature', system), fillMin: f.fillTimeS / 60,
    outlet: toDisplay(f.outletTempC, 'temperature', system), final: toDisplay(f.finalTempC, 'temperature', system),
    target: f.target ? toDisplay(f.target.targetTempC, 'temperature', system) : null,
    targetFlow: f.target?.flowM3PerS ? toDisplay(f.target.flowM3PerS, 'volumeFlow', system) : null,
    targetFillMin: f.target?.fillTimeS ? f.target.fillTimeS / 60 : null,
    note: [f.heaterNote, f.target?.note].filter(Boolean).join(' '),
    caution: cautionCell([['heater outlet', f.outletTempC], ['tub', f.finalTempC], ['tub target', f.target?.targetTempC]], system),
  }));
  const own = fills.flatMap((f) => cautionLines(f.fill.cautions, fills.length > 1 ? `${f.label}: ` : ''));
  const notice = sheetNotice(system, [
    { where: 'heater outlet', valuesC: fills.map((f) => f.fill.outletTempC) },
    { where: 'tub', valuesC: fills.flatMap((f) => [f.fill.finalTempC, ...(f.fill.target ? [f.fill.target.targetTempC] : [])]) },
  ], own);
  return { name: 'Tub fill', notice, columns, rows, notes: ['One pass through the heater from the supply, no recirculation; surface losses during the fill are left out.'] };
}
