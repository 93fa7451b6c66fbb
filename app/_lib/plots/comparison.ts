/**
 * Designs overlaid: outlet temperature and delivered heat against flow, one curve per design with
 * its confidence band, its trials, and a rule at the common flow of the comparison. Curves and
 * bands come from the performance table's rule (analysis/performance/performance-table.ts:
 * q = ρ(Tin)·V̇·cp·(Tout − Tin) at one inlet), the rule the comparison's numbers use.
 */
import * as Plot from '@observablehq/plot';
import type { FitSuccess } from '../../../analysis/fit';
import { heatPerKelvinWPerK, performanceTable } from '../../../analysis/performance/performance-table';
import { hottestCautions } from '../../../analysis/safety/cautions';
import { baseOptions, COLORS, DASHES, type PlotFigure } from '@/app/_plots/theme';
import { displayUnits, fmt, withUnit } from '@/app/_contracts/units';
import type { UnitSystem } from '@/analysis/units/unit-system';
import { sentences } from '@/app/_plots/words';

/** Stroke of each design, reference first (told apart by dash and dot symbol too, not by colour alone). */
export const DESIGN_STROKES = [COLORS.heat, COLORS.water, COLORS.heatDeep, COLORS.inkSoft] as const;
const SYMBOLS = ['circle', 'square', 'triangle', 'diamond'] as const;

/** One design to draw: its key and name, and its fit (x = flow m³/s, y = outlet °C). */
export interface ComparisonPlotDesign {
  key: string;
  label: string;
  fit: FitSuccess;
}

/** The two figures of a comparison. */
export interface ComparisonFigures {
  outlet: PlotFigure;
  heat: PlotFigure;
}

interface Row { x: number; y: number; lo: number; hi: number }

/** The design's curve over its tested flows widened by 15 % each side, at the common inlet. */
function curveOf(d: ComparisonPlotDesign, inletTempC: number, points: number) {
  const [lo, hi] = d.fit.xRange;
  const span = hi - lo || hi || 1;
  const a = Math.max(lo - 0.15 * span, lo / 2), b = hi + 0.15 * span;
  const grid = Array.from({ length: points }, (_, i) => a + ((b - a) * i) / (points - 1));
  try {
    return performanceTable(d.fit, grid, inletTempC).rows;
  } catch {
    return [];
  }
}

/**
 * The overlaid figures, in the reader's units.
 * @param designs two or more designs, reference first
 * @param inletTempC the common inlet, °C
 * @param flowM3PerS the common flow of the verdict, m³/s (drawn as a rule)
 * @param units 'si' or 'us'
 * @throws RangeError for fewer than two designs
 * @example comparisonPlots([{ key: 'A', label: 'Stovepipe Coil A', fit: a }, { key: 'B', label: 'Long coil', fit: b }], 17.5, 1.5e-4, 'si')
 */
export function comparisonPlots(designs: ComparisonPlotDesign[], inletTempC: number, flowM3PerS: number, units: UnitSystem, size: { width?: number; height?: number } = {}): ComparisonFigures {
  if (designs.length < 2) throw new RangeError('comparisonPlots: give at least two designs');
  const u = displayUnits(units);
  const F = u.flow.from, T = u.temp.from, P = u.power.from;
  const curves = designs.map((d) => curveOf(d, inletTempC, 81));
  const name = (d: ComparisonPlotDesign) => `${d.key}: ${d.label}`;
  const stroke = (i: number) => DESIGN_STROKES[i % DESIGN_STROKES.length];

  const outletRows: Row[][] = curves.map((rows) => rows.map((r) => ({ x: F(r.flowM3PerS), y: T(r.outletTempC), lo: T(r.outletCiC[0]), hi: T(r.outletCiC[1]) })));
  const heatRows: Row[][] = curves.map((rows) => rows.map((r) => ({ x: F(r.flowM3PerS), y: P(r.heatW), lo: P(r.heatCiW[0]), hi: P(r.heatCiW[1]) })));
  const trialsOf = (d: ComparisonPlotDesign, heat: boolean) => d.fit.spec.x.map((x, i) => {
    const tout = d.fit.spec.y[i];
    const tin = d.fit.spec.covariates.Tin?.[i] ?? inletTempC;
    const q = heatPerKelvinWPerK(x, Math.min(Math.max(tin, 0.01), 99.9), Math.min(Math.max(tout, 0.01), 99.9)) * (tout - tin);
    return { x: F(x), y: heat ? P(q) : T(tout), tip: `${name(d)}: ${withUnit(x, u.flow)}, ${heat ? withUnit(q, u.power) : withUnit(tout, u.temp)}` };
  });

  const figure = (rows: Row[][], heat: boolean): PlotFigure => {
    const marks: Plot.Markish[] = [];
    rows.forEach((r, i) => marks.push(Plot.areaY(r, { x: 'x', y1: 'lo', y2: 'hi', fill: stroke(i), fillOpacity: 0.16, ariaDescription: `${designs[i].key} confidence band` })));
    marks.push(Plot.ruleX([F(flowM3PerS)], { stroke: COLORS.inkMuted, strokeDasharray: '3 3', ariaDescription: 'common flow' }));
    rows.forEach((r, i) => marks.push(Plot.lineY(r, { x: 'x', y: 'y', stroke: stroke(i), strokeWidth: 2.25, strokeDasharray: DASHES[i % DASHES.length], ariaDescription: `${designs[i].key} curve` })));
    designs.forEach((d, i) => marks.push(Plot.dot(trialsOf(d, heat), { x: 'x', y: 'y', r: 3.5, symbol: SYMBOLS[i % SYMBOLS.length], fill: stroke(i), stroke: 'white', strokeWidth: 1, title: 'tip', ariaDescription: `${d.key} trials` })));
    // labels at the right end of each curve: the design's key only, so that they stay short
    const ends = rows.map((r, i) => ({ ...r[r.length - 1], key: designs[i].key, fill: stroke(i) })).filter((e) => e.x !== undefined);
    marks.push(Plot.text(ends, { x: 'x', y: 'y', text: 'key', fill: 'fill', dx: 8, textAnchor: 'start', fontWeight: 600, ariaDescription: 'design keys' }));
    const what = heat ? 'Delivered heat' : 'Outlet temperature';
    const title = `${what} against flow — ${designs.map((d) => d.key).join(', ')}`;
    const summary = sentences([
      `${designs.map(name).join('; ')}`,
      `each curve at a common inlet of ${withUnit(inletTempC, u.temp)} with its ${fmt(designs[0].fit.level * 100, 2)} % confidence band, drawn over its own tested flows widened by 15 %`,
      `the dashed rule marks the common flow, ${withUnit(flowM3PerS, u.flow)}`,
      heat ? 'trial points are each trial\'s own measured heat' : 'trial points are measured outlets, each at its own inlet',
    ]);
    const ys = rows.flat().flatMap((r) => [r.lo, r.hi]).filter(Number.isFinite);
    const xs = rows.flat().map((r) => r.x);
    return {
      title, summary,
      ...(heat ? {} : { cautions: hottestCautions([{ where: 'outlet', valuesC: designs.flatMap((d) => d.fit.spec.y) }], units) }),
      options: {
        ...baseOptions({ ...size, ariaLabel: title, ariaDescription: summary }),
        marginRight: 36,
        x: { label: `Flow (${u.flow.label}) →`, grid: true, domain: xs.length ? [Math.min(...xs), Math.max(...xs)] : undefined },
        y: { label: `↑ ${what} (${heat ? u.power.label : u.temp.label})`, grid: true, ...(ys.length ? { domain: [Math.min(...ys, ...(heat ? [0] : [])), Math.max(...ys)], nice: true } : {}) },
        marks,
      },
    };
  };
  return { outlet: figure(outletRows, false), heat: figure(heatRows, true) };
}
