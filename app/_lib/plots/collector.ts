/**
 * The plots of a collector efficiency test (ISO 9806 steady-state form, analysis/performance/
 * collector-test.ts): η against the reduced temperature x = (Tm − Ta)/G with the fitted curve at
 * the band irradiance and its confidence band (extrapolated parts dashed), the points the
 * steadiness limits left out drawn hollow; residuals against x and against trial order. x stays
 * in m²·K/W in both unit systems: the coefficients a1 and a2 are stated on it.
 */
import * as Plot from '@observablehq/plot';
import type { CollectorTestResult } from '../../../analysis/performance/collector-test';
import { fmt } from '@/app/_contracts/units';
import { baseOptions, COLORS, type PlotFigure } from '@/app/_plots/theme';
import { sentences } from '@/app/_plots/words';

/** A point left out by the steadiness limits, with its η and x (null when they cannot be formed). */
export interface CollectorExcludedPoint { label: string; efficiency: number | null; xM2KPerW: number | null; reasons: string[] }

/** The three figures of a collector test. */
export interface CollectorFigures { curve: PlotFigure; resX: PlotFigure; resOrder: PlotFigure }

/**
 * @param r a successful collector test
 * @param labels a label per point of `r.points` (e.g. the trial's time)
 * @param excluded points the steadiness limits left out (drawn hollow on the curve)
 * @example collectorPlots(result, labels, []).curve.options
 */
export function collectorPlots(r: CollectorTestResult, labels: string[], excluded: CollectorExcludedPoint[] = []): CollectorFigures {
  const basis = `${r.areaBasis} area ${fmt(r.areaM2, 3)} m²`;
  const pts = r.points.map((p, i) => ({ x: p.xM2KPerW, y: p.efficiency, res: p.residual, order: i + 1, tip: `${labels[i] ?? `trial ${i + 1}`}: η ${fmt(p.efficiency, 3)}, x ${fmt(p.xM2KPerW, 4)} m²·K/W, residual ${fmt(p.residual, 4)}` }));
  const hollow = excluded.filter((e) => e.efficiency !== null && e.xM2KPerW !== null).map((e) => ({ x: e.xM2KPerW!, y: e.efficiency!, tip: `${e.label} (left out): ${e.reasons.join('; ')}` }));
  const inside = r.band.filter((b) => !b.extrapolated);
  const outside = r.band.filter((b) => b.extrapolated);
  const levelPct = Math.round(r.level * 100);
  const curveSummary = sentences([
    `Efficiency η on the ${basis} against the reduced temperature x = (Tm − Ta)/G for ${r.n} steady points; the fitted curve η0 − a1·x − a2·G·x² is drawn at G = ${fmt(r.bandIrradianceWPerM2, 0)} W/m² with its ${levelPct} % confidence band`,
    `η0 = ${fmt(r.eta0.value, 3)} ± ${fmt(r.eta0.stdErr, 3)}, a1 = ${fmt(r.a1WPerM2K.value, 2)} ± ${fmt(r.a1WPerM2K.stdErr, 2)} W/(m²·K), a2 = ${fmt(r.a2WPerM2K2.value, 4)} ± ${fmt(r.a2WPerM2K2.stdErr, 4)} W/(m²·K²)`,
    outside.length ? 'the dashed part of the curve lies outside the tested x range (extrapolated)' : '',
    hollow.length ? `${hollow.length} point(s) left out by the steadiness limits are drawn hollow` : '',
  ]);
  const title = `Collector efficiency against reduced temperature (${r.areaBasis} area)`;
  const curve: PlotFigure = {
    title,
    summary: curveSummary,
    options: {
      ...baseOptions({ ariaLabel: title, ariaDescription: curveSummary }),
      x: { label: 'Reduced temperature x = (Tm − Ta)/G (m²·K/W) →', grid: true },
      y: { label: `↑ Efficiency η (${r.areaBasis} area)`, grid: true },
      marks: [
        Plot.areaY(r.band, { x: 'xM2KPerW', y1: 'ciLow', y2: 'ciHigh', fill: COLORS.heatPale, fillOpacity: 0.35, ariaDescription: `${levelPct} % confidence band` }),
        Plot.line(inside, { x: 'xM2KPerW', y: 'efficiency', stroke: COLORS.heat, strokeWidth: 2, ariaDescription: 'fitted curve' }),
        ...(outside.length ? [Plot.line(outside.filter((b) => b.xM2KPerW <= r.xRangeM2KPerW[0]), { x: 'xM2KPerW', y: 'efficiency', stroke: COLORS.heat, strokeWidth: 1.5, strokeDasharray: '5 4', ariaDescription: 'extrapolated curve' })] : []),
        Plot.dot(pts, { x: 'x', y: 'y', r: 4, fill: COLORS.point, stroke: 'white', strokeWidth: 1.25, title: 'tip', ariaDescription: 'steady points' }),
        ...(hollow.length ? [Plot.dot(hollow, { x: 'x', y: 'y', r: 4.5, fill: 'none', stroke: COLORS.inkMuted, strokeWidth: 1.5, title: 'tip', ariaDescription: 'points left out' })] : []),
      ],
    },
  };
  const largest = pts.reduce((m, p) => (Math.abs(p.res) > Math.abs(m.res) ? p : m), pts[0]);
  const guides = [
    Plot.ruleY([-2 * r.residualSD, 2 * r.residualSD], { stroke: COLORS.inkMuted, strokeDasharray: '3 4', ariaDescription: '±2 residual SD' }),
    Plot.ruleY([0], { stroke: COLORS.ink, strokeWidth: 1.25, ariaDescription: 'zero line' }),
  ];
  const dim = { width: 420, height: 280 };
  const resXTitle = 'Efficiency residuals against reduced temperature';
  const resXSummary = sentences([`${r.n} residuals η − η̂ against x; residual SD ${fmt(r.residualSD, 4)}; largest ${largest ? fmt(largest.res, 4) : '–'}`, 'a curve here means the order of the curve does not match the data']);
  const resOrderTitle = 'Efficiency residuals in trial order';
  const resOrderSummary = sentences([`${r.n} residuals in the order the trials were run`, 'a trend here means drift (soiling, a sensor warming, the sun moving off the plane)']);
  return {
    curve,
    resX: { title: resXTitle, summary: resXSummary, options: { ...baseOptions({ ...dim, ariaLabel: resXTitle, ariaDescription: resXSummary }), x: { label: 'x (m²·K/W) →', grid: true }, y: { label: '↑ Residual of η', grid: true }, marks: [...guides, Plot.dot(pts, { x: 'x', y: 'res', r: 4, fill: COLORS.point, stroke: 'white', title: 'tip', ariaDescription: 'residuals' })] } },
    resOrder: { title: resOrderTitle, summary: resOrderSummary, options: { ...baseOptions({ ...dim, ariaLabel: resOrderTitle, ariaDescription: resOrderSummary }), x: { label: 'Trial order →', grid: true, tickFormat: 'd' }, y: { label: '↑ Residual of η', grid: true }, marks: [...guides, Plot.line(pts, { x: 'order', y: 'res', stroke: COLORS.inkMuted, strokeOpacity: 0.5 }), Plot.dot(pts, { x: 'order', y: 'res', r: 4, fill: COLORS.point, stroke: 'white', title: 'tip', ariaDescription: 'residuals' })] } },
  };
}
