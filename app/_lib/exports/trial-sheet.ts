/** The Trials sheet: raw inputs and derived values per trial (DOMAIN.md §7). */
import type { TrialInput, TrialDerivation } from '@/analysis/trial/derive-trial';
import type { ExportColumn, ExportRow } from './columns';
import { toDisplay, spreadToDisplay } from '@/app/_contracts/units';
import type { UnitSystem } from '@/analysis/units/unit-system';
import { FMT, quantityColumn } from './quantity-columns';
import type { TrialExportRow } from './types';
import type { SheetSpec } from './xlsx';
import { cautionCell, sheetNotice } from './safety';

/**
 * Adapter: a trial's record, its `deriveTrial` input and result → one export row.
 * @example trialExportRow({ id: 't1' }, input, deriveTrial(input))
 */
export function trialExportRow(
  meta: Omit<TrialExportRow, 'flowM3PerS' | 'inletTempC' | 'outletTempC'>, input: TrialInput, derived?: TrialDerivation,
): TrialExportRow {
  return {
    ...meta,
    flowM3PerS: input.flowM3PerS, inletTempC: input.inletTempC, outletTempC: input.outletTempC,
    sourceTempC: meta.sourceTempC ?? input.sourceTempC ?? null,
    ...(derived ? {
      massFlowKgPerS: derived.massFlowKgPerS, deltaTK: derived.deltaTK, heatW: derived.heatW,
      effectiveness: derived.effectiveness, uaWPerK: derived.uaWPerK,
    } : {}),
  };
}

/**
 * The Trials sheet in `system` units; one "Fill k" column per fill time of the longest list.
 * @example trialsSheet(rows, 'us').columns[4].header // 'Flow'
 */
export function trialsSheet(trials: readonly TrialExportRow[], system: UnitSystem): SheetSpec {
  const fills = trials.reduce((m, t) => Math.max(m, t.fillTimesS?.length ?? 0), 0);
  const q = (key: string, header: string, quantity: Parameters<typeof quantityColumn>[2]) => quantityColumn(key, header, quantity, system);
  const columns: ExportColumn[] = [
    { key: 'id', header: 'Trial' },
    { key: 'order', header: 'Order', numFmt: FMT.count },
    { key: 'timestamp', header: 'Time (UTC)', csvName: 'timestamp_utc' },
    { key: 'included', header: 'Included in fit' },
    { key: 'steady', header: 'Steady' },
    q('flow', 'Flow', 'volumeFlow'),
    q('inlet', 'Inlet temperature', 'temperature'),
    q('outlet', 'Outlet temperature', 'temperature'),
    q('source', 'Source temperature', 'temperature'),
    q('ambient', 'Ambient temperature', 'temperature'),
    q('bucket', 'Bucket volume', 'volume'),
    ...Array.from({ length: fills }, (_, k) => quantityColumn(`fill${k + 1}`, `Fill ${k + 1}`, 'time', system, '0.00')),
    q('irradiance', 'Irradiance', 'irradiance'),
    q('wind', 'Wind', 'speed'),
    q('massFlow', 'Mass flow', 'massFlow'),
    q('deltaT', 'Temperature rise', 'temperatureDifference'),
    q('heat', 'Heat rate', 'power'),
    q('heatU', 'Heat rate standard uncertainty', 'power'),
    { key: 'effectiveness', header: 'Effectiveness', numFmt: FMT.ratio },
    q('ua', 'UA', 'conductance'),
    { key: 'notes', header: 'Notes' },
    { key: 'caution', header: 'Caution' },
  ];
  const rows = trials.map((t): ExportRow => {
    const row: ExportRow = {
      id: t.id, order: t.order ?? null, timestamp: t.timestamp ?? null, included: t.included ?? true, steady: t.steady ?? null,
      flow: toDisplay(t.flowM3PerS, 'volumeFlow', system), inlet: toDisplay(t.inletTempC, 'temperature', system),
      outlet: toDisplay(t.outletTempC, 'temperature', system), source: toDisplay(t.sourceTempC, 'temperature', system),
      ambient: toDisplay(t.ambientTempC, 'temperature', system), bucket: toDisplay(t.bucketVolumeM3, 'volume', system),
      irradiance: toDisplay(t.irradianceWPerM2, 'irradiance', system), wind: toDisplay(t.windMPerS, 'speed', system),
      massFlow: toDisplay(t.massFlowKgPerS, 'massFlow', system), deltaT: spreadToDisplay(t.deltaTK, 'temperatureDifference', system),
      heat: toDisplay(t.heatW, 'power', system), heatU: toDisplay(t.heatUncertaintyW, 'power', system),
      effectiveness: t.effectiveness ?? null, ua: toDisplay(t.uaWPerK, 'conductance', system), notes: t.notes ?? null,
      caution: cautionCell([['inlet', t.inletTempC], ['outlet', t.outletTempC]], system),
    };
    t.fillTimesS?.forEach((s, k) => { row[`fill${k + 1}`] = s; });
    return row;
  });
  const notice = sheetNotice(system, [{ where: 'outlet', valuesC: trials.map((t) => t.outletTempC) }, { where: 'inlet', valuesC: trials.map((t) => t.inletTempC) }]);
  return { name: 'Trials', notice, columns, rows };
}
