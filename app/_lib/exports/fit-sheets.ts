/**
 * The Fit sheet (parameters, standard errors, intervals, covariance and correlation), the
 * Residuals sheet (per-point residuals and diagnostics, DOMAIN.md §7) and the fit statistics for
 * the Summary. Heater built-ins are converted to the display units: each parameter maps
 * affinely (°C → °F, K → °F, W/K → Btu/(h·°F), s/m³ → 1/gpm, polynomial bₖ → °F per gpmᵏ), its
 * standard error and covariance with the factor only. Other models stay in the units they were
 * fitted in.
 */
import { BUILTIN_MODELS } from '@/analysis/fit';
import type { ExportColumn, ExportRow } from './columns';
import { displayUnit, toDisplay, spreadToDisplay } from '@/app/_contracts/units';
import type { UnitSystem } from '@/analysis/units/unit-system';
import { FMT, quantityColumn } from './quantity-columns';
import type { FitExport } from './types';
import type { SheetSpec, SummaryItem } from './xlsx';
import { cautionCell, sheetNotice } from './safety';

interface ParamUnit { label: string; factor: number; offset: number }

/** Display unit of each parameter of a fit (label '' when unknown: as fitted). */
export function parameterUnits(fx: FitExport, system: UnitSystem): Record<string, ParamUnit> {
  const out: Record<string, ParamUnit> = {};
  const builtin = BUILTIN_MODELS[fx.fit.model];
  const heater = fx.heater !== false && builtin !== undefined;
  const temp = displayUnit('temperature', system), diff = displayUnit('temperatureDifference', system);
  const flow = displayUnit('volumeFlow', system), ua = displayUnit('conductance', system);
  builtin?.parameters.forEach((name, k) => {
    const u = builtin.parameterUnits[name];
    if (!heater) out[name] = { label: u, factor: 1, offset: 0 };
    else if (u === '°C') out[name] = { label: temp.label, factor: temp.factor, offset: temp.offset };
    else if (u === 'K') out[name] = { label: diff.label, factor: diff.factor, offset: 0 };
    else if (u === 'W/K') out[name] = { label: ua.label, factor: ua.factor, offset: 0 };
    else if (u === 's/m³') out[name] = { label: `1/(${flow.label})`, factor: 1 / flow.factor, offset: 0 };
    else if (builtin.polynomialDegree !== undefined) {
      out[name] = k === 0
        ? { label: temp.label, factor: temp.factor, offset: temp.offset }
        : { label: `${diff.label}/(${flow.label})${k > 1 ? `^${k}` : ''}`, factor: diff.factor / flow.factor ** k, offset: 0 };
    } else out[name] = { label: u, factor: 1, offset: 0 };
  });
  for (const name of fx.fit.parameterNames) out[name] ??= { label: '', factor: 1, offset: 0 };
  return out;
}

const label = (fx: FitExport) => fx.label ?? fx.fit.model;

/** The Fit sheet: one row per parameter of every model, with covariance and correlation columns. */
export function fitSheet(fits: readonly FitExport[], system: UnitSystem): SheetSpec {
  const names = [...new Set(fits.flatMap((f) => f.fit.parameterNames))];
  const columns: ExportColumn[] = [
    { key: 'model', header: 'Model' }, { key: 'parameter', header: 'Parameter' }, { key: 'unit', header: 'Unit' },
    { key: 'value', header: 'Estimate', numFmt: FMT.stat }, { key: 'se', header: 'Standard error', numFmt: FMT.stat },
    { key: 'ciLow', header: 'CI low', numFmt: FMT.stat }, { key: 'ciHigh', header: 'CI high', numFmt: FMT.stat },
    { key: 'level', header: 'Level', numFmt: '0%' }, { key: 't', header: 't value', numFmt: '0.00' },
    { key: 'p', header: 'p value', numFmt: FMT.pValue }, { key: 'atBound', header: 'At bound' },
    ...names.map((n) => ({ key: `cov:${n}`, header: `Covariance with ${n}`, csvName: `cov_${n}`, numFmt: FMT.scientific })),
    ...names.map((n) => ({ key: `corr:${n}`, header: `Correlation with ${n}`, csvName: `corr_${n}`, numFmt: FMT.ratio })),
  ];
  const rows = fits.flatMap((fx) => {
    const units = parameterUnits(fx, system);
    const f = fx.fit;
    return f.parameterNames.map((name, i): ExportRow => {
      const e = f.params[name], u = units[name];
      const row: ExportRow = {
        model: label(fx), parameter: name, unit: u.label || 'as fitted',
        value: e.value * u.factor + u.offset, se: e.stdErr * Math.abs(u.factor),
        ciLow: e.ciLow * u.factor + u.offset, ciHigh: e.ciHigh * u.factor + u.offset,
        level: f.level, t: e.tValue, p: e.pValue, atBound: e.atBound ?? '',
      };
      f.parameterNames.forEach((other, j) => {
        row[`cov:${other}`] = f.covariance[i][j] * u.factor * units[other].factor;
        row[`corr:${other}`] = f.correlation[i][j];
      });
      return row;
    });
  });
  return {
    name: 'Fit', notice: sheetNotice(system), columns, rows,
    notes: ['Covariance is in the units of the row parameter times those of the column parameter.',
      ...fits.flatMap((fx) => fx.fit.warnings.map((w) => `${label(fx)}: ${w.message}`))],
  };
}

/** The Residuals sheet: per point of every model, residuals, leverage, influence and flags. */
export function residualsSheet(fits: readonly FitExport[], system: UnitSystem): SheetSpec {
  const heater = fits.every((f) => f.heater !== false);
  const x = heater ? quantityColumn('x', 'Flow', 'volumeFlow', system) : { key: 'x', header: 'x', numFmt: FMT.stat };
  const yq = (key: string, header: string, diff = false): ExportColumn => heater
    ? quantityColumn(key, header, diff ? 'temperatureDifference' : 'temperature', system) : { key, header, numFmt: FMT.stat };
  const columns: ExportColumn[] = [
    { key: 'model', header: 'Model' }, { key: 'point', header: 'Point', numFmt: FMT.count }, { key: 'trial', header: 'Trial' },
    x, yq('observed', 'Observed outlet'), yq('fitted', 'Fitted outlet'), yq('residual', 'Residual', true),
    { key: 'standardized', header: 'Standardized residual', numFmt: '0.000' },
    { key: 'studentized', header: 'Studentized residual', numFmt: '0.000' },
    { key: 'leverage', header: 'Leverage', numFmt: '0.000' }, { key: 'cooks', header: "Cook's distance", numFmt: '0.000' },
    { key: 'dffits', header: 'DFFITS', numFmt: '0.000' },
    { key: 'highLeverage', header: 'High leverage' }, { key: 'influential', header: 'Influential' }, { key: 'outlier', header: 'Outlier' },
    ...(heater ? [{ key: 'caution', header: 'Caution' }] : []),
  ];
  const rows = fits.flatMap((fx) => {
    const f = fx.fit;
    const hi = new Set(f.flags.highLeverage), inf = new Set(f.flags.influential), out = new Set(f.flags.outliers);
    const X = (v: number) => (heater ? toDisplay(v, 'volumeFlow', system) : v);
    const Y = (v: number) => (heater ? toDisplay(v, 'temperature', system) : v);
    const D = (v: number) => (heater ? spreadToDisplay(v, 'temperature', system) : v);
    return f.spec.x.map((xi, i): ExportRow => ({
      model: label(fx), point: i + 1, trial: fx.pointIds?.[i] ?? null, x: X(xi), observed: Y(f.spec.y[i]), fitted: Y(f.fitted[i]),
      residual: D(f.residuals[i]), standardized: f.standardizedResiduals[i], studentized: f.studentizedResiduals[i],
      leverage: f.leverage[i], cooks: f.cooksDistance[i], dffits: f.dffits[i],
      highLeverage: hi.has(i), influential: inf.has(i), outlier: out.has(i),
      ...(heater ? { caution: cautionCell([['observed outlet', f.spec.y[i]], ['fitted outlet', f.fitted[i]]], system) } : {}),
    }));
  });
  const notice = heater
    ? sheetNotice(system, [{ where: 'outlet', valuesC: fits.flatMap((fx) => [...fx.fit.spec.y, ...fx.fit.fitted]) }])
    : undefined;
  return {
    name: 'Residuals', ...(notice ? { notice } : {}), columns, rows,
    notes: ['High leverage: h > 2p/n; influential: Cook’s D > 4/n or |DFFITS| > 2√(p/n) (Belsley, Kuh & Welsch 1980).'],
  };
}

/** Fit statistics of each model for the Summary sheet. */
export function fitSummaryItems(fits: readonly FitExport[], system: UnitSystem): SummaryItem[] {
  return fits.flatMap((fx) => {
    const f = fx.fit, section = `Fit: ${label(fx)}`;
    const heater = fx.heater !== false;
    const flow = displayUnit('volumeFlow', system), diff = displayUnit('temperatureDifference', system);
    const items: SummaryItem[] = [
      { section, key: 'Model', value: f.model }, { section, key: 'Expression', value: f.expression },
      { section, key: 'Method', value: f.method }, { section, key: 'Converged', value: f.converged },
      { section, key: 'Points (n)', value: f.n }, { section, key: 'Parameters (p)', value: f.p }, { section, key: 'Degrees of freedom', value: f.df },
      { section, key: 'Residual SD', value: heater ? spreadToDisplay(f.residualSD, 'temperature', system) : f.residualSD, unit: heater ? diff.label : '', numFmt: FMT.stat },
      { section, key: 'RMSE', value: heater ? spreadToDisplay(f.rmse, 'temperature', system) : f.rmse, unit: heater ? diff.label : '', numFmt: FMT.stat },
      { section, key: 'Weighted RSS', value: f.rss, numFmt: FMT.scientific },
      { section, key: 'R²', value: f.r2, numFmt: FMT.stat }, { section, key: 'Adjusted R²', value: f.adjustedR2, numFmt: FMT.stat },
      { section, key: 'AIC', value: f.aic, numFmt: '0.00' }, { section, key: 'AICc', value: f.aicc, numFmt: '0.00' }, { section, key: 'BIC', value: f.bic, numFmt: '0.00' },
      { section, key: 'Confidence level', value: f.level, numFmt: '0%' },
      { section, key: 'Condition number', value: f.conditionNumber, numFmt: FMT.scientific },
      { section, key: 'Iterations', value: f.iterations },
      { section, key: heater ? 'Flow range low' : 'x range low', value: heater ? toDisplay(f.xRange[0], 'volumeFlow', system) : f.xRange[0], unit: heater ? flow.label : '', numFmt: FMT.stat },
      { section, key: heater ? 'Flow range high' : 'x range high', value: heater ? toDisplay(f.xRange[1], 'volumeFlow', system) : f.xRange[1], unit: heater ? flow.label : '', numFmt: FMT.stat },
    ];
    const lof = f.lackOfFit;
    if (lof && lof.ok) {
      items.push({ section, key: 'Lack-of-fit F', value: lof.F, numFmt: '0.000' }, { section, key: 'Lack-of-fit p', value: lof.pValue, numFmt: FMT.pValue },
        { section, key: 'Lack-of-fit verdict', value: lof.verdict });
    } else if (lof) items.push({ section, key: 'Lack-of-fit test', value: lof.reason });
    return items;
  });
}
