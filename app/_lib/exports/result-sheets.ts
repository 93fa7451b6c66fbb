/**
 * The Performance table, Forecast series and Costs sheets, and the forecast's scalar results for
 * the Summary; each takes the analysis result as it is (analysis/performance, analysis/forecast,
 * analysis/cost) and converts to the display units.
 */
import type { ExportColumn, ExportRow } from './columns';
import { displayUnit, spreadToDisplay, toDisplay } from '@/app/_contracts/units';
import type { UnitSystem } from '@/analysis/units/unit-system';
import { FMT, quantityColumn } from './quantity-columns';
import type { CostExport, ForecastExport, PerformanceExport } from './types';
import type { SeasonView } from '@/app/_contracts/study-blocks';
import type { SheetSpec, SummaryItem } from './xlsx';
import { cautionCell, cautionLines, sheetNotice } from './safety';

/** The Performance table sheet: every row of every table, intervals, heat and cautions. */
export function performanceSheet(tables: readonly PerformanceExport[], system: UnitSystem): SheetSpec {
  const t = (key: string, header: string) => quantityColumn(key, header, 'temperature', system);
  const q = (key: string, header: string) => quantityColumn(key, header, 'power', system);
  const columns: ExportColumn[] = [
    { key: 'model', header: 'Model' }, t('inlet', 'Inlet temperature'), quantityColumn('flow', 'Flow', 'volumeFlow', system),
    t('outlet', 'Outlet temperature'), t('outletCiLow', 'Outlet CI low'), t('outletCiHigh', 'Outlet CI high'),
    t('outletPiLow', 'Outlet PI low'), t('outletPiHigh', 'Outlet PI high'),
    quantityColumn('deltaT', 'Temperature rise', 'temperatureDifference', system),
    q('heat', 'Heat rate'), q('heatCiLow', 'Heat CI low'), q('heatCiHigh', 'Heat CI high'), q('heatPiLow', 'Heat PI low'), q('heatPiHigh', 'Heat PI high'),
    { key: 'level', header: 'Level', numFmt: '0%' }, { key: 'extrapolated', header: 'Extrapolated' }, { key: 'caution', header: 'Caution' },
  ];
  const T = (v: number) => toDisplay(v, 'temperature', system), Q = (v: number) => toDisplay(v, 'power', system);
  const rows = tables.flatMap(({ label, table }) => table.rows.map((r): ExportRow => ({
    model: label ?? table.model, inlet: T(table.inletTempC), flow: toDisplay(r.flowM3PerS, 'volumeFlow', system),
    outlet: T(r.outletTempC), outletCiLow: T(r.outletCiC[0]), outletCiHigh: T(r.outletCiC[1]), outletPiLow: T(r.outletPiC[0]), outletPiHigh: T(r.outletPiC[1]),
    deltaT: spreadToDisplay(r.deltaTK, 'temperatureDifference', system),
    heat: Q(r.heatW), heatCiLow: Q(r.heatCiW[0]), heatCiHigh: Q(r.heatCiW[1]), heatPiLow: Q(r.heatPiW[0]), heatPiHigh: Q(r.heatPiW[1]),
    level: table.level, extrapolated: r.extrapolated,
    caution: cautionCell([['outlet', r.outletTempC], ['outlet (upper prediction limit)', r.outletPiC[1]]], system),
  })));
  const notes = tables.flatMap(({ label, table }) => table.notes.map((n) => (tables.length > 1 ? `${label ?? table.model}: ${n}` : n)));
  // one caution per hazard: the predicted outlet up to its upper prediction limit
  const notice = sheetNotice(system, [{ where: 'predicted outlet', valuesC: tables.flatMap(({ table }) => table.rows.flatMap((r) => [r.outletTempC, r.outletPiC[1]])) }]);
  return { name: 'Performance', notice, columns, rows, notes };
}

/** The Forecast series sheet: pool and outlet temperature at the sample times of every forecast. */
export function forecastSheet(forecasts: readonly ForecastExport[], system: UnitSystem): SheetSpec {
  const stamped = forecasts.some((f) => f.startTime);
  const columns: ExportColumn[] = [
    { key: 'forecast', header: 'Forecast' },
    ...(stamped ? [{ key: 'time', header: 'Time (UTC)', csvName: 'timestamp_utc' }] : []),
    { key: 'hours', header: 'Elapsed', unit: 'h', numFmt: FMT.hours },
    quantityColumn('pool', 'Pool temperature', 'temperature', system),
    quantityColumn('outlet', 'Heater outlet temperature', 'temperature', system),
    { key: 'caution', header: 'Caution' },
  ];
  const rows: ExportRow[] = [];
  forecasts.forEach((f, k) => {
    const r = f.result, name = f.label ?? `Forecast ${k + 1}`;
    for (let i = 0; i < r.timeH.length; i++) {
      rows.push({
        forecast: name, hours: r.timeH[i], time: f.startTime ? new Date(f.startTime.getTime() + r.timeH[i] * 3_600_000) : null,
        pool: toDisplay(r.tempC[i], 'temperature', system), outlet: toDisplay(r.outletTempC[i], 'temperature', system),
        caution: cautionCell([['pool', r.tempC[i]], ['heater outlet', r.outletTempC[i]]], system),
      });
    }
  });
  // the forecast's own cautions (dead-heading, a source above boiling, its pool and outlet) head the sheet
  const own = forecasts.flatMap((f, k) => cautionLines(f.result.cautions, forecasts.length > 1 ? `${f.label ?? `Forecast ${k + 1}`}: ` : ''));
  return { name: 'Forecast', notice: sheetNotice(system, [], own), columns, rows };
}

/** Scalar forecast results (energy budget by term, hours to target, equilibrium) for the Summary. */
export function forecastSummaryItems(forecasts: readonly ForecastExport[], system: UnitSystem): SummaryItem[] {
  const temp = displayUnit('temperature', system).label, energy = displayUnit('energy', system).label;
  return forecasts.flatMap((f, k) => {
    const r = f.result, section = `Forecast: ${f.label ?? `Forecast ${k + 1}`}`, e = r.energy;
    const E = (key: string, v: number): SummaryItem => ({ section, key, value: toDisplay(v, 'energy', system), unit: energy, numFmt: '0.00' });
    return [
      { section, key: 'Final pool temperature', value: toDisplay(r.finalTempC, 'temperature', system), unit: temp, numFmt: '0.00' },
      { section, key: 'Highest pool temperature', value: toDisplay(r.maxTempC, 'temperature', system), unit: temp, numFmt: '0.00' },
      { section, key: 'Highest outlet temperature', value: toDisplay(r.maxOutletTempC, 'temperature', system), unit: temp, numFmt: '0.00' },
      { section, key: 'Hours to target', value: r.hoursToTarget, unit: 'h', numFmt: FMT.hours },
      { section, key: 'Equilibrium temperature', value: toDisplay(r.equilibriumTempC, 'temperature', system), unit: temp, numFmt: '0.00' },
      { section, key: 'Equilibrium note', value: r.equilibriumNote },
      { section, key: 'Pool water mass', value: toDisplay(r.poolMassKg, 'mass', system), unit: displayUnit('mass', system).label, numFmt: '#,##0' },
      E('Heater energy', e.heaterJ), E('Solar gain', e.solarJ), E('Evaporation loss', e.evaporationJ), E('Convection loss', e.convectionJ),
      E('Radiation loss', e.radiationJ), E('Wall loss', e.wallsJ), E('Net stored energy', e.netJ),
      { section, key: 'Water evaporated', value: toDisplay(e.evaporatedKg, 'mass', system), unit: displayUnit('mass', system).label, numFmt: '0.0' },
      ...(f.measuredDay ? measuredDayItems(section, f.measuredDay, system) : []),
    ];
  });
}

/** The measured day of a forecast for the Summary: measured against forecast, the residual and the gain it implies, each with its uncertainty, and the verdict. */
function measuredDayItems(section: string, d: NonNullable<ForecastExport['measuredDay']>, system: UnitSystem): SummaryItem[] {
  const temp = displayUnit('temperature', system).label, dT = displayUnit('temperatureDifference', system).label, power = displayUnit('power', system).label;
  const T = (key: string, v: number): SummaryItem => ({ section, key, value: toDisplay(v, 'temperature', system), unit: temp, numFmt: '0.00' });
  const K = (key: string, v: number): SummaryItem => ({ section, key, value: spreadToDisplay(v, 'temperatureDifference', system), unit: dT, numFmt: '0.00' });
  const W = (key: string, v: number): SummaryItem => ({ section, key, value: spreadToDisplay(v, 'power', system), unit: power, numFmt: '0.00' });
  return [
    T('Measured start temperature', d.startTemp_degC), T('Measured end temperature', d.observedEndTemp_degC), T('Forecast end temperature', d.predictedEndTemp_degC),
    K('Residual (measured − forecast)', d.residual_K), K('Residual standard uncertainty', d.residualU_K),
    W('Gain the model did not include', d.unmodelledGain_W), W('Its standard uncertainty', d.unmodelledGainU_W),
    { section, key: 'Measured day verdict', value: d.verdict },
  ];
}

/** The Costs sheet: build lines with subtotals, tax and total; running cost; payback. */
export function costsSheet(c: CostExport, system: UnitSystem): SheetSpec {
  const cur = c.currency;
  const columns: ExportColumn[] = [
    { key: 'section', header: 'Section' }, { key: 'group', header: 'Group' }, { key: 'item', header: 'Item' },
    { key: 'quantity', header: 'Quantity', numFmt: '0.##' }, { key: 'unitCost', header: 'Unit cost', unit: cur, numFmt: FMT.money },
    { key: 'amount', header: 'Amount', numFmt: FMT.money }, { key: 'per', header: 'Unit' }, { key: 'taxable', header: 'Taxable' },
  ];
  const rows: ExportRow[] = [];
  if (c.build) {
    const b = c.build;
    for (const l of b.lines) rows.push({ section: 'Build', group: l.subassembly, item: l.description, quantity: l.quantity, unitCost: l.unitCost, amount: l.extended, per: cur, taxable: l.taxable });
    for (const s of b.subtotals) rows.push({ section: 'Build', group: s.subassembly, item: 'Subtotal', amount: s.subtotal, per: cur });
    rows.push({ section: 'Build', item: 'Subtotal', amount: b.subtotal, per: cur }, { section: 'Build', item: 'Tax', amount: b.tax, per: cur },
      { section: 'Build', item: 'Total', amount: b.total, per: cur });
  }
  if (c.usefulHeat) {
    const u = c.usefulHeat;
    rows.push(
      { section: 'Running', group: u.fuel, item: 'Cost per useful therm (100,000 Btu delivered)', amount: u.perUsefulTherm, per: `${cur}/therm` },
      { section: 'Running', group: u.fuel, item: 'Cost per useful kWh', amount: u.perUsefulKWh, per: `${cur}/kWh` },
      { section: 'Running', group: u.fuel, item: u.fuel === 'heat-pump' ? 'COP' : `Efficiency (${u.basis})`, amount: u.efficiency, per: '' },
    );
  }
  if (c.perDegree) {
    rows.push(system === 'us'
      ? { section: 'Running', item: 'Cost per degree of the pool', amount: c.perDegree.perDegF, per: `${cur}/°F` }
      : { section: 'Running', item: 'Cost per degree of the pool', amount: c.perDegree.perK, per: `${cur}/K` });
  }
  for (const r of c.running ?? []) {
    const m = r.currency, energy = displayUnit('energy', system).label;
    rows.push(
      { section: 'Running', group: r.label, item: `Price (${r.fuel})`, quantity: 1, unitCost: r.price, amount: r.price, per: `${m}/${r.priceUnit}` },
      { section: 'Running', group: r.label, item: r.fuel === 'heat-pump' ? 'COP' : 'Efficiency (HHV)', amount: r.efficiency, per: '' },
      { section: 'Running', group: r.label, item: 'Cost per useful therm (100,000 Btu delivered)', amount: r.perUsefulTherm, per: `${m}/therm` },
      { section: 'Running', group: r.label, item: 'Cost per useful kWh', amount: r.perUsefulKWh, per: `${m}/kWh` },
    );
    if (r.perDegF !== null && r.perK !== null) {
      rows.push(system === 'us'
        ? { section: 'Running', group: r.label, item: 'Cost per degree of the pool', amount: r.perDegF, per: `${m}/°F` }
        : { section: 'Running', group: r.label, item: 'Cost per degree of the pool', amount: r.perK, per: `${m}/K` });
    }
    rows.push(
      { section: 'Running', group: r.label, item: `Useful heat (${r.heatBasis})`, amount: toDisplay(r.heatJ, 'energy', system), per: energy },
      { section: 'Running', group: r.label, item: 'Fuel for that heat', amount: r.fuelQuantity, per: r.priceUnit },
      { section: 'Running', group: r.label, item: 'Cost of that heat', amount: r.heatCost, per: m },
    );
    if (r.season) rows.push(...seasonRows(r.label, r.season, system));
  }
  if (c.payback) {
    const p = c.payback;
    rows.push(
      { section: 'Payback', item: 'Annual running cost, this heater', amount: p.annualCostThis, per: `${cur}/year` },
      { section: 'Payback', item: 'Annual running cost, the other', amount: p.annualCostOther, per: `${cur}/year` },
      { section: 'Payback', item: 'Annual saving', amount: p.annualSaving, per: `${cur}/year` },
      { section: 'Payback', item: 'Simple payback', amount: p.years, per: p.years === null ? 'never pays back' : 'years' },
      { section: 'Payback', item: 'Capital per useful therm over the life', amount: p.capitalPerUsefulTherm, per: `${cur}/therm` },
    );
  }
  const notes = c.usefulHeat || c.perDegree || c.running?.length ? ['Running costs exclude losses during heat-up; heat content on the higher heating value (HHV).'] : [];
  return { name: 'Costs', columns, rows, notes };
}

/** A cost sheet's season: the losses at its target, its heat, fuel and cost, and the payback of the build. */
function seasonRows(group: string, s: SeasonView, system: UnitSystem): ExportRow[] {
  const m = s.currency, energy = displayUnit('energy', system).label, power = displayUnit('power', system).label;
  const P = (w: number) => toDisplay(w, 'power', system);
  const row = (item: string, amount: number | string | null, per: string): ExportRow => ({ section: 'Season', group, item, amount, per });
  const out: ExportRow[] = [
    row('Season length', s.days, 'days'), row('Heater hours a day', s.hoursPerDay, 'h'),
    row('Target temperature', toDisplay(s.targetTempC, 'temperature', system), displayUnit('temperature', system).label),
    row('Cover on outside the heater hours', s.cover ? 'yes' : 'no', ''),
    row('Mean losses at the target', P(s.lossW), power), row('Mean solar gain', P(s.solarW), power),
    row('Heater hours a day that hold the target', s.holdHoursPerDay, s.holdHoursPerDay === null ? 'cannot hold' : 'h'),
    row('Useful heat of the season', toDisplay(s.usefulJ, 'energy', system), energy),
    row(`Fuel bought (${s.fuelUnit})`, s.fuelUnits, s.fuelUnit), row('Fuel bought (kWh)', s.fuelKWh, 'kWh'), row('Fuel bought (therm)', s.fuelTherms, 'therm'),
    row('Running cost of the season', s.annualCost, m),
  ];
  const p = s.payback;
  if (p) {
    out.push(
      row(`Build cost (${p.buildBasis})`, p.buildCost, m),
      row(`Purchased heater (${p.purchasedFuel}, ${p.purchasedFuel === 'heat-pump' ? 'COP' : 'efficiency'} ${p.purchasedEfficiency})`, p.purchasedPrice, m),
      row('Running cost of the season, purchased heater', p.annualCostPurchased, m), row('Saving a season', p.annualSaving, m),
      row('Payback', p.years, p.years === null ? 'never' : 'seasons'), row('Payback in words', p.verdict, ''),
    );
  }
  return out;
}
