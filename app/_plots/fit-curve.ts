/**
 * Outlet temperature against flow: trials (excluded ones hollow), replicate means ± SD, one curve
 * per model, the primary model's confidence and prediction bands, the tested flow range with the
 * extrapolated region shaded, and reference lines for the inlet, scalding and boiling.
 */
import * as Plot from '@observablehq/plot';
import type { BandPoint } from '@/analysis/fit';
import { CAUTION_THRESHOLDS_C, HAZARD_BANDS, hottestCautions } from '@/analysis/safety/cautions';
import { baseOptions, COLORS, DASHES, MODEL_STROKES, type PlotFigure } from './theme';
import { placeLabels, textBox, type Box } from './label-placement';

/** Trials with a hover tooltip each, at most. */
export const TOOLTIP_MAX_TRIALS = 300;
import { displayUnits, fmt, withUnit } from '@/app/_contracts/units';
import type { UnitSystem } from '@/analysis/units/unit-system';
import { sentences } from './words';

/** One trial, SI: flow m³/s, outlet °C. */
export interface FitCurveTrial {
  flowM3PerS: number;
  outletTempC: number;
  /** left out of the fit (drawn hollow) */
  excluded?: boolean;
  /** shown in the point's tooltip, e.g. a trial number */
  label?: string;
}

/** Replicate trials at one flow setting, SI (n ≥ 2 are drawn as mean ± SD). */
export interface FitCurveReplicate {
  flowM3PerS: number;
  meanC: number;
  /** sample standard deviation, K (null for a single trial) */
  sdK: number | null;
  n: number;
}

/** One fitted model's curve over the plotted flows (the first model is the primary one). */
export interface FitCurveModel {
  label: string;
  /** predictions with intervals (units of the fit: m³/s, °C), increasing in flow (predictAt's BandPoints, or their numbers as JSON carries them) */
  points: Pick<BandPoint, 'x' | 'y' | 'ciLow' | 'ciHigh' | 'piLow' | 'piHigh'>[];
}

/** Everything fitCurvePlot draws, SI. */
export interface FitCurveInput {
  trials: FitCurveTrial[];
  replicates: FitCurveReplicate[];
  /** primary first; its intervals are drawn as the bands */
  models: FitCurveModel[];
  /** [min, max] flow of the fitted trials, m³/s */
  testedRange: [number, number];
  /** inlet temperature, °C (null to omit the rule) */
  inletTempC: number | null;
  /** confidence level of the bands, e.g. 0.95 */
  level: number;
}

/** Boiling at 1 atm, °C (common practice; analysis uses the IF97 saturation temperature 99.97 °C). */
const BOILING_C = 100;

/**
 * Outlet temperature against flow, in the user's units.
 * @param input - see {@link FitCurveInput} (SI)
 * @param units - 'si' or 'us'
 * @returns options for Plot.plot / plotToSvg, a title and a summary for the figcaption
 * @example plotToSvg(fitCurvePlot(fitCurveInputFromFits([{ label: 'coil', fit }]), 'us').options)
 */
export function fitCurvePlot(input: FitCurveInput, units: UnitSystem, size: { width?: number; height?: number } = {}): PlotFigure {
  const u = displayUnits(units);
  const F = u.flow.from;
  const T = u.temp.from;
  const primary = input.models[0];
  const [lo, hi] = input.testedRange;

  const bandRows = (primary?.points ?? []).map((p) => ({ x: F(p.x), ci1: T(p.ciLow), ci2: T(p.ciHigh), pi1: T(p.piLow), pi2: T(p.piHigh) }));
  const curves = input.models.map((m) => m.points.map((p) => ({ x: F(p.x), y: T(p.y) })));
  const allX = [...input.trials.map((t) => t.flowM3PerS), ...input.models.flatMap((m) => m.points.map((p) => p.x)), lo, hi];
  const xMin = Math.min(...allX);
  const xMax = Math.max(...allX);
  const temps = [
    ...input.trials.map((t) => t.outletTempC),
    ...input.replicates.flatMap((r) => (r.sdK === null ? [r.meanC] : [r.meanC - r.sdK, r.meanC + r.sdK])),
    ...(primary?.points ?? []).flatMap((p) => [p.piLow, p.piHigh]),
    ...input.models.slice(1).flatMap((m) => m.points.map((p) => p.y)),
    ...(input.inletTempC !== null ? [input.inletTempC] : []),
  ].filter(Number.isFinite);
  let yLo = Math.min(...temps);
  let yHi = Math.max(...temps);
  // boiling shown whenever the data come within 15 K of it; scald lines whenever inside the range
  if (yHi > BOILING_C - 15) yHi = Math.max(yHi, BOILING_C + 2);
  const pad = 0.04 * (yHi - yLo || 1);
  yLo -= pad;
  yHi += pad;

  const refs: { y: number; text: string; stroke: string; dash: string; kind: string }[] = [];
  if (input.inletTempC !== null) refs.push({ y: input.inletTempC, text: `inlet ${withUnit(input.inletTempC, u.temp)}`, stroke: COLORS.water, dash: '4 4', kind: 'inlet' });
  const band = (code: string) => HAZARD_BANDS.find((b) => b.code === code)!;
  const safety = [
    { c: CAUTION_THRESHOLDS_C.spaLimit, text: band('spa-limit').short, stroke: COLORS.caution, kind: 'spa-limit' },
    { c: CAUTION_THRESHOLDS_C.scald, text: band('scald').short, stroke: COLORS.caution, kind: 'scald' },
    { c: CAUTION_THRESHOLDS_C.scaldSeconds, text: band('scald-seconds').short, stroke: COLORS.danger, kind: 'scald-seconds' },
    { c: BOILING_C, text: 'boiling at', stroke: COLORS.danger, kind: 'boiling' },
  ];
  for (const s of safety) if (s.c >= yLo && s.c <= yHi) refs.push({ y: s.c, text: `${s.text} ${withUnit(s.c, u.temp)}`, stroke: s.stroke, dash: s.kind === 'boiling' ? 'none' : '6 3', kind: s.kind });
  const refRows = refs.map((r) => ({ ...r, yd: T(r.y) }));

  const extrap = [
    ...(xMin < lo ? [{ x1: F(xMin), x2: F(lo), side: 'below' }] : []),
    ...(xMax > hi ? [{ x1: F(hi), x2: F(xMax), side: 'above' }] : []),
  ];
  const included = input.trials.filter((t) => !t.excluded);
  const excluded = input.trials.filter((t) => t.excluded);
  const tip = (t: FitCurveTrial) => `${t.label ? `${t.label}: ` : ''}${withUnit(t.flowM3PerS, u.flow)}, ${withUnit(t.outletTempC, u.temp)}${t.excluded ? ' (excluded from the fit)' : ''}`;
  const dots = (rows: FitCurveTrial[]) => rows.map((t) => ({ x: F(t.flowM3PerS), y: T(t.outletTempC), tip: tip(t) }));
  // A tooltip per dot helps with tens of trials; among hundreds the dots overlap and the tooltips only weigh the page.
  const dotTitle = input.trials.length <= TOOLTIP_MAX_TRIALS ? 'tip' : undefined;
  const reps = input.replicates.filter((r) => r.n >= 2 && r.sdK !== null).map((r) => ({
    x: F(r.flowM3PerS), y: T(r.meanC), y1: T(r.meanC - (r.sdK as number)), y2: T(r.meanC + (r.sdK as number)),
    tip: `mean of ${r.n} replicates at ${withUnit(r.flowM3PerS, u.flow)}: ${withUnit(r.meanC, u.temp)} ± ${withUnit(r.sdK as number, u.tempDiff, 2)} (SD)`,
  }));
  const pct = `${fmt(input.level * 100, 2)} %`;
  const { refLabels, modelLabels } = placePlotLabels({
    size, x: [F(xMin), F(xMax)], y: [T(yLo), T(yHi)], curves, labels: input.models.map((m) => m.label),
    points: [...dots(included), ...dots(excluded)], reps, refs: refRows,
    extrapolated: extrap.filter((d) => d.x2 - d.x1 >= 0.12 * (F(xMax) - F(xMin))).map((d) => (d.x1 + d.x2) / 2),
  });

  const marks: Plot.Markish[] = [
    Plot.rect(extrap, { x1: 'x1', x2: 'x2', fill: COLORS.paperDeep, fillOpacity: 0.9, ariaDescription: 'extrapolated region' }),
    Plot.text(extrap.filter((d) => d.x2 - d.x1 >= 0.12 * (F(xMax) - F(xMin))), { x: (d: { x1: number; x2: number }) => (d.x1 + d.x2) / 2, frameAnchor: 'bottom', dy: -6, text: () => 'extrapolated', fill: COLORS.inkMuted, ariaDescription: 'extrapolated label' }),
    Plot.areaY(bandRows, { x: 'x', y1: 'pi1', y2: 'pi2', fill: COLORS.heatPale, fillOpacity: 0.22, ariaDescription: `${pct} prediction band` }),
    Plot.areaY(bandRows, { x: 'x', y1: 'ci1', y2: 'ci2', fill: COLORS.heatLight, fillOpacity: 0.35, ariaDescription: `${pct} confidence band` }),
    ...refRows.flatMap((r) => [
      Plot.ruleY([r.yd], { stroke: r.stroke, strokeDasharray: r.dash, strokeWidth: 1.25, ariaDescription: `${r.kind} line` }),
      // along its rule, clear of the data (placePlotLabels): the inlet's from the left, the others from the right
      Plot.text(refLabels.filter((l) => l.key === r.kind), {
        x: 'x', y: 'y', text: 'label', fill: r.stroke, textAnchor: 'middle', lineAnchor: 'middle',
        stroke: 'white', strokeWidth: 3, paintOrder: 'stroke', ariaDescription: `${r.kind} label`,
      }),
    ]),
    ...curves.map((c, i) => Plot.lineY(c, {
      x: 'x', y: 'y', stroke: MODEL_STROKES[i % MODEL_STROKES.length], strokeWidth: i === 0 ? 2.5 : 1.75,
      strokeDasharray: DASHES[i % DASHES.length], ariaDescription: `model ${input.models[i].label}`,
    })),
    // each model's name beside its own curve, where it overlaps no data, line or other label (placeModelLabels)
    Plot.text(modelLabels, {
      x: 'x', y: 'y', text: 'label', fill: 'color', textAnchor: 'middle', lineAnchor: 'middle',
      stroke: 'white', strokeWidth: 3, paintOrder: 'stroke', ariaDescription: 'model labels',
    }),
    Plot.ruleX(reps, { x: 'x', y1: 'y1', y2: 'y2', stroke: COLORS.ink, strokeWidth: 1.25, marker: 'tick', ariaDescription: 'replicate error bars' }),
    Plot.dot(reps, { x: 'x', y: 'y', symbol: 'diamond', r: 4, fill: COLORS.paper, stroke: COLORS.ink, strokeWidth: 1.5, title: 'tip', ariaDescription: 'replicate means' }),
    Plot.dot(dots(excluded), { x: 'x', y: 'y', r: 4.5, fill: 'none', stroke: COLORS.inkSoft, strokeWidth: 1.5, title: dotTitle, ariaDescription: 'excluded trials' }),
    Plot.dot(dots(included), { x: 'x', y: 'y', r: 4, fill: COLORS.point, stroke: 'white', strokeWidth: 1.25, title: dotTitle, ariaDescription: 'trials' }),
  ];

  const title = `Outlet temperature against flow${primary ? ` — ${input.models.map((m) => m.label).join(', ')}` : ''}`;
  const parts = [
    `${included.length} trial${included.length === 1 ? '' : 's'} fitted${excluded.length ? `, ${excluded.length} excluded (hollow)` : ''}`,
    `tested flows ${withUnit(lo, u.flow)} to ${withUnit(hi, u.flow)}${extrap.length ? '; beyond them the curves are extrapolated (shaded)' : ''}`,
  ];
  if (primary) parts.push(`${primary.label} curve with its ${pct} confidence band (mean) and prediction band (one new trial)`);
  if (input.models.length > 1) parts.push(`also drawn: ${input.models.slice(1).map((m) => m.label).join(', ')} (dashed)`);
  if (reps.length) parts.push(`${reps.length} replicate mean${reps.length === 1 ? '' : 's'} with ± 1 SD bars`);
  const warn = refs.filter((r) => r.kind !== 'inlet').map((r) => r.text);
  if (warn.length) parts.push(`safety lines: ${warn.join('; ')}`);
  const summary = sentences(parts);

  // one caution per hazard for the outlet the plot shows: measured trials and the curve over the tested flows
  const cautions = hottestCautions([{
    where: 'outlet',
    valuesC: [...input.trials.map((t) => t.outletTempC), ...(primary?.points ?? []).filter((p) => p.x >= lo && p.x <= hi).map((p) => p.y)],
  }], units);

  return {
    title,
    summary,
    cautions,
    options: {
      ...baseOptions({ ...size, ariaLabel: title, ariaDescription: summary }),
      x: { label: `Flow (${u.flow.label}) →`, domain: [F(xMin), F(xMax)], grid: true, nice: false },
      y: { label: `↑ Outlet temperature (${u.temp.label})`, domain: [T(yLo), T(yHi)], grid: true },
      marks,
    },
  };
}

/** What placePlotLabels places and avoids, in display units (the plot's x and y). */
interface LabelScene {
  size: { width?: number; height?: number };
  /** the x and y domains of the plot */
  x: [number, number];
  y: [number, number];
  curves: { x: number; y: number }[][];
  labels: string[];
  points: { x: number; y: number }[];
  reps: { x: number; y: number; y1: number; y2: number }[];
  refs: { yd: number; text: string; kind: string }[];
  /** x of the centre of each "extrapolated" label */
  extrapolated: number[];
}

/** Label centres along a curve, best first: about three quarters across, then outward in steps of 4 %. */
const ALONG = [0.72, ...Array.from({ length: 17 }, (_, k) => [0.72 + 0.04 * (k + 1), 0.72 - 0.04 * (k + 1)]).flat()].filter((f) => f > 0.02 && f < 0.99);
/** Offsets of a label's centre from its curve, px, nearest first: just above and below, then a line and two further. */
const OFFSETS_PX = [[-12, 14], [-24, 26], [-36, 38]];
/** Offsets of a reference label's centre above (or below) its rule, px: close to it first, then a little further. */
const RULE_GAPS_PX = [10, 18];

/** A placed label in display units, keyed by the reference line's kind or the model's label. */
export interface PlotLabel {
  x: number;
  y: number;
  label: string;
  key: string;
  color: string;
}

/**
 * Places the labels of the fit plot so that none overlaps another, a trial, a replicate bar, a
 * curve or a reference line, at the plot's own width (a phone's too): first each reference
 * line's label along its rule (the inlet's from the left edge, where the curves are high; the
 * safety lines' from the right edge, where they are low), then each model's name beside its own
 * curve. Works in the pixels of the frame the theme sets (baseOptions), as Plot's linear scales
 * map the domains given here, and returns the centres in display units.
 */
export function placePlotLabels(scene: LabelScene): { refLabels: PlotLabel[]; modelLabels: PlotLabel[] } {
  const o = baseOptions({ ...scene.size, ariaLabel: '', ariaDescription: '' });
  const [W, H] = [o.width as number, o.height as number];
  const [mL, mR, mT, mB] = [o.marginLeft as number, o.marginRight as number, o.marginTop as number, o.marginBottom as number];
  const font = 12; // baseOptions' font size
  const [x0, x1] = scene.x;
  const [y0, y1] = scene.y;
  const px = (v: number) => mL + ((v - x0) / (x1 - x0 || 1)) * (W - mL - mR);
  const py = (v: number) => mT + ((y1 - v) / (y1 - y0 || 1)) * (H - mT - mB);
  const frame: Box = { x: mL, y: mT, width: W - mL - mR, height: H - mT - mB };
  const around = (cx: number, cy: number, r: number): Box => ({ x: cx - r, y: cy - r, width: 2 * r, height: 2 * r });
  const obstacles: Box[] = [
    ...scene.points.map((p) => around(px(p.x), py(p.y), 5.5)),
    ...scene.reps.flatMap((r) => [around(px(r.x), py(r.y), 5), { x: px(r.x) - 4, y: py(r.y2), width: 8, height: py(r.y1) - py(r.y2) }]),
    ...scene.curves.flatMap((c) => c.slice(1).map((p, i) => {
      const [a, b] = [c[i], p];
      const [ax, ay, bx, by] = [px(a.x), py(a.y), px(b.x), py(b.y)];
      return { x: Math.min(ax, bx) - 1.5, y: Math.min(ay, by) - 1.5, width: Math.abs(bx - ax) + 3, height: Math.abs(by - ay) + 3 };
    })),
    ...scene.refs.map((r) => ({ x: mL, y: py(r.yd) - 0.5, width: W - mL - mR, height: 1 })),
    ...scene.extrapolated.map((x) => textBox('extrapolated', px(x), H - mB - 6, font)),
  ];
  const refRequests = scene.refs.map((r) => {
    const w = textBox(r.text, 0, 0, font).width;
    const travel = Math.max(0, frame.width - w - 8);
    const cxs = Array.from({ length: 13 }, (_, k) => (r.kind === 'inlet' ? mL + 4 + w / 2 + (k / 12) * travel : W - mR - 4 - w / 2 - (k / 12) * travel));
    return { text: r.text, candidates: RULE_GAPS_PX.flatMap((gap) => cxs.flatMap((cx) => [-gap, gap].map((dy) => ({ cx, cy: py(r.yd) + dy })))) };
  });
  const modelRequests = scene.curves.map((c, i) => ({
    text: scene.labels[i],
    // nearest to the curve first (just above or below it, then a line further out), each along the curve from ¾ across
    candidates: OFFSETS_PX.flatMap((pair) => ALONG.flatMap((f) => {
      const p = c[Math.min(c.length - 1, Math.round(f * (c.length - 1)))];
      return p ? pair.map((dy) => ({ cx: px(p.x), cy: py(p.y) + dy })) : [];
    })),
  }));
  const placed = placeLabels([...refRequests, ...modelRequests], obstacles, frame, font);
  const back = (p: { cx: number; cy: number }) => ({
    x: x0 + ((p.cx - mL) / (W - mL - mR)) * (x1 - x0),
    y: y1 - ((p.cy - mT) / (H - mT - mB)) * (y1 - y0),
  });
  const refLabels = scene.refs.flatMap((r) => {
    const p = placed.find((q) => q.text === r.text);
    return p ? [{ ...back(p), label: r.text, key: r.kind, color: '' }] : [];
  });
  const modelLabels = scene.labels.flatMap((label, i) => {
    const p = placed.slice(refRequests.length).find((q) => q.text === label);
    return p ? [{ ...back(p), label, key: label, color: MODEL_STROKES[i % MODEL_STROKES.length] }] : [];
  });
  return { refLabels, modelLabels };
}
