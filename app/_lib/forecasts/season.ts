/**
 * A season's energy and money (DOMAIN.md §6): a forecast's pool held at a target temperature for
 * a season of the user's length and use (heater hours a day, the cover on outside them or not).
 * The pool's losses come from the forecast's own loss model — the mean balance of
 * analysis/forecast/equilibrium-temperature.ts (`meanBalance`, `holdHoursPerDay`) under the
 * forecast's weather — and the money from analysis/cost: `annualHeaterEnergy` with the season's
 * burner and pool hours in place of the DOE's 104 h and 4,464 h, `usefulHeatCost` for the fuel,
 * `buildCostSheet` for a build given by its items and `payback` against a purchased heater.
 * Pure (it runs in the analysis pool with the forecast): no server-only, no ORM.
 */
import { z } from 'zod';
import { annualHeaterEnergy } from '@/analysis/cost/annual-energy';
import { buildCostSheet } from '@/analysis/cost/build-cost';
import { FUELS, type FuelKind } from '@/analysis/cost/fuels';
import { payback } from '@/analysis/cost/payback';
import { USEFUL_THERM_J, usefulHeatCost } from '@/analysis/cost/useful-heat-cost';
import { holdHoursPerDay, meanBalance, type MeanBalanceInput } from '@/analysis/forecast/equilibrium-temperature';
import { resolveTerms } from '@/analysis/forecast/loss-terms';
import type { ForecastInput } from '@/analysis/forecast/recirculating-forecast';
import { temperatureCautions } from '@/analysis/safety/cautions';
import { parseQuantity } from '@/analysis/units/parse-quantity';
import { InputError, readingInput } from '@/analysis/units/reading-input';
import { fastDensityKgPerM3 } from '@/analysis/water/property-table';
import type { SeasonView } from '@/app/_contracts/study-blocks';
import { DomainError, invalid } from '../server/errors';

export const FUEL_KINDS = ['natural-gas', 'propane', 'electric-resistance', 'heat-pump', 'wood'] as const;

const buildItem = z.object({
  subassembly: z.string().trim().min(1, 'name the sub-assembly').max(60),
  description: z.string().trim().max(120).default(''),
  quantity: z.number().min(0).max(1e6),
  unitCost: z.number().min(0).max(1e7),
  taxable: z.boolean().optional(),
}).strict();

/** The season of a cost sheet (a study's costs block or the forecast page's cost), as stored and posted. */
export const seasonSettings = z.object({
  /** length of the season, days */
  days: z.number({ error: 'give the season’s length in days' }).int('whole days').min(1, 'at least 1 day').max(366, 'at most 366 days'),
  /** heater hours a day */
  hoursPerDay: z.number({ error: 'give the heater hours a day' }).int('whole hours').min(1, 'at least 1 h a day').max(24, 'at most 24 h a day'),
  /** the temperature the pool is held at (a quantity with its unit, e.g. "28 degC") */
  targetTemp: z.string({ error: 'give the target temperature' }).trim().min(1, 'give the target temperature').max(40),
  /**
   * the season's mean weather (a typical day), when the forecast has no weather of its own or the
   * season's differs: read by the forecast's own reader (airTemp, relativeHumidity 0–1, wind, solar)
   */
  weather: z.object({
    airTemp: z.string().trim().min(1, 'give the mean air temperature').max(40),
    relativeHumidity: z.number().min(0, 'a fraction 0–1').max(1, 'a fraction 0–1 (0.6 for 60 %)'),
    wind: z.string().trim().max(40).optional(),
    solar: z.string().trim().max(40).optional(),
  }).strict().optional(),
  /** the pool's water surface, when the forecast gives only a volume (e.g. "32 m^2") */
  surfaceArea: z.string().trim().min(1).max(40).optional(),
  /** the cover on whenever the heater is off */
  cover: z.boolean().default(false),
  /** what the build cost, or give its items */
  buildPrice: z.number().min(0, 'not negative').max(1e7, 'at most 10,000,000').nullable().optional(),
  buildItems: z.array(buildItem).max(60, 'at most 60 build items').optional(),
  taxRate: z.number().min(0).max(1, 'a fraction 0–1 (0.08 for 8 %)').optional(),
  /** the heater one could buy instead */
  purchased: z.object({
    price: z.number().min(0, 'not negative').max(1e7, 'at most 10,000,000').nullable().optional(),
    fuel: z.enum(FUEL_KINDS).optional(),
    /** its fuel or electricity price per unit; default the build's when the fuel is the same */
    fuelPrice: z.number().min(0, 'not negative').max(1e6).nullable().optional(),
    /** η 0–1, or its COP for a heat pump; default the fuel's typical value */
    efficiency: z.number().positive('more than 0').max(10, 'at most 10 (a COP)').nullable().optional(),
  }).strict().optional(),
}).strict();
export type SeasonSettings = z.infer<typeof seasonSettings>;

/** What the rig of the forecast's saved fit cost to build (its details), the build cost when the season gives none. */
export interface RigBuild { amount: number; rig: string }
/** The fuel, price and efficiency of the build (the cost sheet's own), and its rig's build cost when known. */
export interface BuildFuel { fuel: FuelKind; pricePerUnit: number; efficiency?: number; currency: string; rigBuild?: RigBuild }

/** The first problem of a season's settings as invalid input naming the field (`season.days: at most 366 days`). */
export function parseSeason(v: unknown, prefix = 'season'): SeasonSettings {
  const p = seasonSettings.safeParse(v);
  if (p.success) return p.data;
  const i = p.error.issues[0];
  const field = [prefix, ...(i?.path ?? [])].join('.');
  const message = i?.code === 'unrecognized_keys' ? `unknown setting ${i.keys.join(', ')}` : i?.message ?? 'not valid';
  throw invalid(`${field}: ${message}`, { [field]: message });
}

const must = <T,>(field: string, f: () => T): T => {
  try {
    return readingInput(() => f());
  } catch (e) {
    if (e instanceof InputError || e instanceof RangeError || e instanceof TypeError) throw invalid(`${field}: ${e.message}`, { [field]: e.message });
    throw e;
  }
};

/**
 * The forecast body a season reads: the forecast's own, with the season's weather and surface
 * in its loss terms when given (the forecast's other loss settings, its cover factors among them, kept).
 * @throws DomainError invalid naming season.surfaceArea when nothing gives the pool's surface
 */
export function seasonForecastBody(body: Record<string, unknown>, s: SeasonSettings): Record<string, unknown> {
  const own = body.losses && typeof body.losses === 'object' ? (body.losses as Record<string, unknown>) : null;
  if (!s.weather && !s.surfaceArea) return body;
  if (!s.weather && !own) throw invalid('season.weather: the forecast has no weather: give the season’s mean air temperature and humidity.', { 'season.weather': 'give the mean air temperature and humidity' });
  const surfaceArea = s.surfaceArea ?? own?.surfaceArea;
  if (surfaceArea === undefined && body.pool === undefined) throw invalid('season.surfaceArea: the forecast gives only a volume: give the pool’s water surface area (e.g. "32 m^2").', { 'season.surfaceArea': 'give the water surface area' });
  return { ...body, losses: { ...(own ?? {}), ...(s.weather ? { weather: s.weather } : {}), ...(surfaceArea !== undefined ? { surfaceArea } : {}) } };
}

/** The 24-hour masks of the season: the heater on the first `hours` hours of the day, the cover on the others (or never). */
function dayMasks(hours: number, cover: boolean) {
  const heaterOn = new Uint8Array(24), covered = new Uint8Array(24);
  for (let h = 0; h < 24; h++) {
    heaterOn[h] = h < hours ? 1 : 0;
    covered[h] = cover && h >= hours ? 1 : 0;
  }
  return { heaterOn, covered };
}

/**
 * The season's heat, fuel, money and payback.
 * @param input the forecast's typed input (its pool, flow, heater, weather and loss terms)
 * @throws DomainError invalid naming the `season.*` field (a forecast without losses, a target outside 1–60 °C, no build cost…)
 */
export function seasonView(input: ForecastInput, s: SeasonSettings, build: BuildFuel, prefix = 'season'): SeasonView {
  try {
    return seasonOf(input, s, build);
  } catch (e) {
    // the field as the caller's body names it (the forecast API's `cost.season.*`)
    if (prefix === 'season' || !(e instanceof DomainError && e.kind === 'invalid')) throw e;
    const fields = Object.fromEntries(Object.entries((e.details.fields ?? {}) as Record<string, string>).map(([k, v]) => [k.replace(/^season/, prefix), v]));
    throw invalid(e.message.replace(/^season/, prefix), fields);
  }
}

function seasonOf(input: ForecastInput, s: SeasonSettings, build: BuildFuel): SeasonView {
  if (!input.losses) throw invalid('season: the forecast has no weather and losses, so a season cannot be costed: switch its losses on.', { season: 'needs the forecast’s losses' });
  const targetC = must('season.targetTemp', () => parseQuantity(s.targetTemp, 'temperature', 'season.targetTemp'));
  if (!(targetC >= 1 && targetC <= 60)) throw invalid(`season.targetTemp: ${targetC.toFixed(1)} °C is outside 1–60 °C.`, { 'season.targetTemp': 'within 1–60 °C' });
  const { heaterOn, covered } = dayMasks(s.hoursPerDay, s.cover);
  const terms = { ...must('season', () => resolveTerms(input.losses as Exclude<ForecastInput['losses'], false>)), cover: covered };
  const massFlow = input.massFlowKgPerS ?? 0;
  const balance: MeanBalanceInput = {
    heater: input.heater, terms, flowM3PerS: input.flowM3PerS ?? massFlow / fastDensityKgPerM3(input.startTempC), massFlowKgPerS: massFlow,
    heaterOn, startHourOfDay: 0, hours: input.hours,
  };
  // the forecast's loss model at the target: net loss = losses − sun; the losses alone with the sun switched off
  const b = meanBalance(balance);
  const netLossW = -b.add(targetC, 0);
  const lossW = -meanBalance({ ...balance, terms: { ...terms, solar: 0 } }).add(targetC, 0);
  const heaterW = b.heaterW(targetC);
  const hold = holdHoursPerDay(balance, targetC);
  const needDayJ = Math.max(0, netLossW) * 86_400;
  const capacityDayJ = Math.max(0, heaterW) * s.hoursPerDay * 3600;
  const limited = needDayJ > capacityDayJ;
  const usefulJ = Math.min(needDayJ, capacityDayJ) * s.days;

  const u = must('efficiency', () => usefulHeatCost({ fuel: build.fuel, pricePerUnit: build.pricePerUnit, efficiency: build.efficiency }));
  const burnerHours = s.hoursPerDay * s.days, poolHours = 24 * s.days;
  // the DOE template with the season's hours: the build's fuel input while it runs, no standing pilot
  const energy = annualHeaterEnergy({
    fuelInputW: usefulJ / (burnerHours * 3600) / u.efficiency, burnerHours, poolHours,
    ...(u.efficiency <= 1 ? { thermalEfficiency: u.efficiency } : {}),
  });
  const fuelUnits = energy.fuelJ / u.heatContentJ;
  const annualCost = fuelUnits * build.pricePerUnit;
  // the hold rule's own words when it cannot hold the target (its hours are shown as a number otherwise)
  const notes: string[] = hold.hoursPerDay === null ? [hold.note] : [];
  if (limited) {
    notes.push(heaterW > 0
      ? `${s.hoursPerDay} h a day of this heater (${heaterW.toFixed(0)} W at ${targetC.toFixed(1)} °C) cannot replace the mean losses: the season's heat is what those hours deliver, and the pool sits below the target.`
      : `The heater gives no heat to water at ${targetC.toFixed(1)} °C: it cannot hold the target, and the season needs no fuel from it.`);
  }
  if (needDayJ === 0) notes.push('The sun and the air alone hold the target under the forecast’s mean weather: the season needs no heater energy.');

  return {
    days: s.days, hoursPerDay: s.hoursPerDay, targetTempC: targetC, cover: s.cover,
    lossW, solarW: lossW - netLossW, netLossW, heaterW, holdHoursPerDay: hold.hoursPerDay, limitedByHeater: limited,
    usefulJ, fuelJ: energy.fuelJ, fuelUnits, fuelUnit: u.priceUnit, fuelKWh: energy.fuelJ / 3.6e6, fuelTherms: energy.fuelJ / USEFUL_THERM_J,
    burnerHours, poolHours, annualCost, currency: build.currency,
    payback: paybackOf(s, u.perUsefulTherm, build, usefulJ),
    notes,
    cautions: temperatureCautions(targetC, 'pool'),
  };
}

/** Payback of the build against the purchased heater: years, or "never" with the reason; null without a purchased heater. */
function paybackOf(s: SeasonSettings, perThermBuild: number, build: BuildFuel, usefulJ: number): SeasonView['payback'] {
  const p = s.purchased;
  if (!p) return null;
  let buildCost: number, buildBasis: string;
  if (s.buildItems?.length) {
    const sheet = must('season.buildItems', () => buildCostSheet(s.buildItems!.map((i) => ({ ...i })), s.taxRate ?? 0));
    buildCost = sheet.total;
    buildBasis = `the ${s.buildItems.length} build item${s.buildItems.length === 1 ? '' : 's'}${s.taxRate ? ` with ${(s.taxRate * 100).toFixed(2).replace(/\.?0+$/, '')} % tax` : ''}`;
  } else if (s.buildPrice != null) {
    buildCost = s.buildPrice;
    buildBasis = 'the build price given';
  } else if (build.rigBuild) {
    buildCost = build.rigBuild.amount;
    buildBasis = `the build cost of the rig "${build.rigBuild.rig}"`;
  } else throw invalid('season.buildPrice: give what the build cost (or its items) to compare it with the purchased heater.', { 'season.buildPrice': 'give what the build cost' });
  if (p.price == null) throw invalid('season.purchased.price: give the price of the heater one could buy instead.', { 'season.purchased.price': 'give its price' });
  const price = p.price;
  const fuel = p.fuel ?? build.fuel;
  const fuelPrice = p.fuelPrice ?? (fuel === build.fuel ? build.pricePerUnit : null);
  if (fuelPrice == null) throw invalid(`season.purchased.fuelPrice: give the price of ${fuel} per ${FUELS[fuel].priceUnit} for the purchased heater.`, { 'season.purchased.fuelPrice': 'give its fuel price' });
  const other = must('season.purchased.efficiency', () => usefulHeatCost({ fuel, pricePerUnit: fuelPrice, efficiency: p.efficiency ?? undefined }));
  const base = { buildCost, buildBasis, purchasedPrice: price, purchasedFuel: fuel, purchasedEfficiency: other.efficiency, perUsefulThermBuild: perThermBuild, perUsefulThermPurchased: other.perUsefulTherm };
  if (!(usefulJ > 0)) {
    return { ...base, annualCostBuild: 0, annualCostPurchased: 0, annualSaving: 0, years: null, verdict: 'Never: the season needs no heat from a heater, so neither runs and nothing is saved.' };
  }
  const extra = buildCost - price;
  const r = payback({ capitalCost: Math.max(0, extra), annualUsefulHeatJ: usefulJ, perUsefulThermThis: perThermBuild, perUsefulThermOther: other.perUsefulTherm });
  const money = (x: number) => `${x.toFixed(2)} ${build.currency}`;
  let years = r.years, verdict: string;
  if (r.years === null) {
    years = null;
    verdict = extra <= 0
      ? `Never: the build costs ${money(-extra)} less up front but ${money(-r.annualSaving)} a season more to run than the purchased heater (${perThermBuild.toFixed(2)} against ${other.perUsefulTherm.toFixed(2)} per useful therm), so the purchased heater catches up${r.annualSaving < 0 ? ` in ${(-extra / -r.annualSaving).toFixed(1)} seasons` : ''}.`
      : `Never: the build costs ${money(extra)} more than the purchased heater and does not run cheaper (${perThermBuild.toFixed(2)} against ${other.perUsefulTherm.toFixed(2)} per useful therm).`;
  } else if (extra <= 0) {
    verdict = `At once: the build costs no more up front than the purchased heater and saves ${money(r.annualSaving)} a season.`;
  } else {
    verdict = `${r.years.toFixed(1)} seasons: the build's extra ${money(extra)} over the purchased heater is saved at ${money(r.annualSaving)} a season.`;
  }
  return { ...base, annualCostBuild: r.annualCostThis, annualCostPurchased: r.annualCostOther, annualSaving: r.annualSaving, years, verdict };
}
