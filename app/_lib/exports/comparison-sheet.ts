/**
 * The Comparison sheet: for each design comparison, every design's fitted parameters with their
 * intervals and its heat at the common inlet and flow (also per metre of tube, per m² of collector
 * and per unit of build cost where the rig records them), each design against the reference (UA
 * ratio, Ts difference, heat difference with the delta-method and bootstrap intervals, the verdict
 * in words), and the heat of every design at the common flows — in the chosen units.
 */
import type { DesignComparisonView } from '@/app/_contracts/design-comparison';
import { displayUnit, withUnit, type DisplayQuantity } from '@/app/_contracts/units';
import type { UnitSystem } from '@/analysis/units/unit-system';
import type { ExportColumn, ExportRow } from './columns';
import { cautionCell, sheetNotice } from './safety';
import type { SheetSpec } from './xlsx';

const at = (q: DisplayQuantity, s: UnitSystem) => displayUnit(q, s).from;
const spread = (q: DisplayQuantity, s: UnitSystem) => (v: number) => v * displayUnit(q, s).factor;

/** Units and conversion of a fitted parameter by its name (Ts a temperature, UA a conductance; others as fitted). */
function param(name: string, system: UnitSystem): { unit: string; at: (v: number) => number; spread: (v: number) => number } {
  if (name === 'Ts') return { unit: displayUnit('temperature', system).label, at: at('temperature', system), spread: spread('temperatureDifference', system) };
  if (name === 'UA') return { unit: displayUnit('conductance', system).label, at: at('conductance', system), spread: spread('conductance', system) };
  return { unit: '', at: (v) => v, spread: (v) => v };
}

/**
 * The Comparison sheet of one or more comparisons.
 * @example comparisonSheet([view], 'si').rows[0] // { comparison: 'Coil length', section: 'Design', design: 'A: Stovepipe Coil A', quantity: 'Ts', … }
 */
export function comparisonSheet(views: readonly DesignComparisonView[], system: UnitSystem): SheetSpec {
  const columns: ExportColumn[] = [
    { key: 'comparison', header: 'Comparison' }, { key: 'section', header: 'Section' }, { key: 'design', header: 'Design' },
    { key: 'quantity', header: 'Quantity' }, { key: 'value', header: 'Value', numFmt: '0.000' },
    { key: 'ciLow', header: 'CI low', numFmt: '0.000' }, { key: 'ciHigh', header: 'CI high', numFmt: '0.000' },
    { key: 'bootLow', header: 'Bootstrap low', numFmt: '0.000' }, { key: 'bootHigh', header: 'Bootstrap high', numFmt: '0.000' },
    { key: 'unit', header: 'Unit' }, { key: 'note', header: 'Note' }, { key: 'caution', header: 'Caution' },
  ];
  const P = at('power', system), L = at('length', system), A = at('area', system), dT = spread('temperatureDifference', system);
  const power = displayUnit('power', system).label, length = displayUnit('length', system).label, area = displayUnit('area', system).label;
  const rows: ExportRow[] = [];
  for (const v of views) {
    const where = `${withUnit(v.inletTempC, displayUnit('temperature', system))} inlet, ${withUnit(v.flowM3PerS, displayUnit('volumeFlow', system))}`;
    const base = { comparison: v.title };
    for (const d of v.designs) {
      const design = `${d.key}: ${d.label}`;
      rows.push({ ...base, section: 'Design', design, quantity: 'Model', note: `${d.modelLabel}, ${d.n} trials, residual SD ${dT(d.residualSD).toFixed(2)} ${displayUnit('temperatureDifference', system).label}`, caution: cautionCell([['measured outlet', d.maxOutletC]], system) });
      for (const p of d.params) {
        const c = param(p.name, system);
        rows.push({ ...base, section: 'Design', design, quantity: p.name, value: c.at(p.value), ciLow: c.at(p.ciLow), ciHigh: c.at(p.ciHigh), unit: c.unit, note: `standard error ${c.spread(p.stdErr).toPrecision(3)}`, caution: p.name === 'Ts' ? cautionCell([['source', p.value]], system) : null });
      }
      rows.push({ ...base, section: 'Design', design, quantity: `Heat at ${where}`, value: P(d.heatW.value), ciLow: P(d.heatW.ciLow), ciHigh: P(d.heatW.ciHigh), unit: power });
      if (d.heatPerMetreW !== null && d.tubeLengthM) rows.push({ ...base, section: 'Design', design, quantity: 'Heat per length of tube', value: P(d.heatW.value) / L(d.tubeLengthM), unit: `${power}/${length}`, note: `tube ${withUnit(d.tubeLengthM, displayUnit('length', system))}` });
      if (d.heatPerM2W !== null && d.collectorAreaM2) rows.push({ ...base, section: 'Design', design, quantity: 'Heat per collector area', value: P(d.heatW.value) / A(d.collectorAreaM2), unit: `${power}/${area}` });
      if (d.heatPerCostW !== null && d.buildCost) rows.push({ ...base, section: 'Design', design, quantity: 'Heat per unit of build cost', value: P(d.heatW.value) / d.buildCost.amount, unit: `${power}/${d.buildCost.currency}`, note: `build cost ${d.buildCost.amount} ${d.buildCost.currency}` });
    }
    for (const p of v.pairs) {
      const design = `${p.keys[1]} against ${p.keys[0]}`;
      const iv = (quantity: string, i: NonNullable<typeof p.uaRatio>, unit: string, f: (x: number) => number = (x) => x) =>
        rows.push({ ...base, section: 'Against the reference', design, quantity, value: f(i.value), ciLow: f(i.ciLow), ciHigh: f(i.ciHigh), bootLow: i.bootstrap ? f(i.bootstrap.ciLow) : null, bootHigh: i.bootstrap ? f(i.bootstrap.ciHigh) : null, unit });
      if (p.uaRatio) iv('UA ratio', p.uaRatio, '');
      if (p.tsDifferenceK) iv('Ts difference', p.tsDifferenceK, displayUnit('temperatureDifference', system).label, dT);
      iv(`Heat difference at ${where}`, p.heatDifferencePercent, '%');
      rows.push({ ...base, section: 'Against the reference', design, quantity: 'Verdict', note: p.verdict });
      for (const n of p.notes) rows.push({ ...base, section: 'Against the reference', design, quantity: 'Note', note: n });
    }
    for (const h of v.heatTable) {
      v.designs.forEach((d, i) => rows.push({ ...base, section: 'Heat at common flows', design: `${d.key}: ${d.label}`, quantity: `Heat at ${withUnit(h.flowM3PerS, displayUnit('volumeFlow', system))}`, value: h.heatW[i] === null ? null : P(h.heatW[i] as number), unit: power, note: h.extrapolated ? 'extrapolated for at least one design' : null }));
    }
  }
  const notice = sheetNotice(system, [{ where: 'measured outlet', valuesC: views.flatMap((v) => v.designs.map((d) => d.maxOutletC)) }]);
  return { name: 'Comparison', notice, columns, rows, notes: views.flatMap((v) => [...v.notes, ...v.problems]) };
}
