/**
 * The Collector sheet of a collector efficiency test (ISO 9806 steady-state form,
 * analysis/performance/collector-test.ts): the coefficients with standard errors and intervals
 * per collector, then every point (x, mean temperature, heat, η, fitted, residual), and the
 * coefficients for the Summary. Coefficients stay in SI (they are defined on the SI x).
 */
import type { ExportColumn, ExportRow } from './columns';
import { toDisplay } from '@/app/_contracts/units';
import type { UnitSystem } from '@/analysis/units/unit-system';
import { FMT, quantityColumn } from './quantity-columns';
import type { CollectorExport } from './types';
import type { SheetSpec, SummaryItem } from './xlsx';
import { cautionCell, sheetNotice } from './safety';

const COEFFS = [
  ['eta0', 'η0', '–'],
  ['a1WPerM2K', 'a1', 'W/(m²·K)'],
  ['a2WPerM2K2', 'a2', 'W/(m²·K²)'],
] as const;

/** The Collector sheet: coefficient rows, then point rows, for every collector test. */
export function collectorSheet(tests: readonly CollectorExport[], system: UnitSystem): SheetSpec {
  const columns: ExportColumn[] = [
    { key: 'collector', header: 'Collector' }, { key: 'row', header: 'Row' }, { key: 'area', header: 'Area basis' },
    { key: 'value', header: 'Estimate', numFmt: FMT.stat }, { key: 'se', header: 'Standard error', numFmt: FMT.stat },
    { key: 'ciLow', header: 'CI low', numFmt: FMT.stat }, { key: 'ciHigh', header: 'CI high', numFmt: FMT.stat }, { key: 'unit', header: 'Unit' },
    { key: 'trial', header: 'Trial' }, { key: 'x', header: 'Reduced temperature (Tm − Ta)/G', unit: 'm²·K/W', csvName: 'x_m2K_per_W', numFmt: FMT.stat },
    quantityColumn('tm', 'Mean fluid temperature', 'temperature', system), quantityColumn('heat', 'Heat rate', 'power', system),
    { key: 'eta', header: 'Efficiency', numFmt: FMT.stat }, { key: 'fitted', header: 'Fitted efficiency', numFmt: FMT.stat },
    { key: 'residual', header: 'Residual', numFmt: FMT.stat }, { key: 'caution', header: 'Caution' },
  ];
  const rows: ExportRow[] = [];
  for (const c of tests) {
    const area = `${c.test.areaBasis} ${c.test.areaM2} m²`;
    for (const [k, name, unit] of COEFFS) {
      const e = c.test[k];
      rows.push({ collector: c.label, row: name, area, value: e.value, se: e.stdErr, ciLow: e.ciLow, ciHigh: e.ciHigh, unit });
    }
    c.test.points.forEach((p, i) => rows.push({
      collector: c.label, row: `point ${i + 1}`, area, trial: c.trialLabels?.[i] ?? null, x: p.xM2KPerW,
      tm: toDisplay(p.meanTempC, 'temperature', system), heat: toDisplay(p.heatW, 'power', system), eta: p.efficiency, fitted: p.fitted, residual: p.residual,
      caution: cautionCell([['collector fluid (mean)', p.meanTempC]], system),
    }));
  }
  const notes = tests.flatMap((c) => [
    `${c.label}: η = η0 − a1·x − a2·G·x² on the ${c.test.areaBasis} area (ISO 9806 steady state; the quasi-dynamic form is not covered), n = ${c.test.n}, residual SD ${c.test.residualSD.toPrecision(3)}.`,
    ...c.test.excluded.map((e) => `${c.label}: trial ${e.index + 1} left out: ${e.reasons.join('; ')}`),
    ...c.test.warnings.map((w) => `${c.label}: ${w}`),
  ]);
  const notice = sheetNotice(system, [{ where: 'collector fluid', valuesC: tests.flatMap((c) => c.test.points.map((p) => p.meanTempC)) }]);
  return { name: 'Collector', notice, columns, rows, notes };
}

/** The coefficients of each test for the Summary sheet. */
export function collectorSummaryItems(tests: readonly CollectorExport[]): SummaryItem[] {
  return tests.flatMap((c) => [
    { section: `Collector: ${c.label}`, key: 'Area basis', value: `${c.test.areaBasis} (${c.test.areaM2} m²)` },
    ...COEFFS.map(([k, name, unit]) => ({ section: `Collector: ${c.label}`, key: `${name} (± standard error ${c.test[k].stdErr.toPrecision(3)})`, value: c.test[k].value, unit: unit === '–' ? undefined : unit, numFmt: FMT.stat })),
    { section: `Collector: ${c.label}`, key: 'Points', value: c.test.n },
  ]);
}
