import 'server-only';
import { z } from 'zod';
import { FUELS, type FuelKind } from '@/analysis/cost/fuels';
import { costPerDegree, usefulHeatCost, USEFUL_THERM_J } from '@/analysis/cost/useful-heat-cost';
import { energyPerDegreeJPerK } from '@/analysis/pool/energy-per-degree';
import { poolGeometry } from '@/analysis/pool/pool-geometry';
import { readPoolDimensions } from '@/analysis/pool/read-pool-dimensions';
import { InputError, readingInput } from '@/analysis/units/reading-input';
import { invalid } from '../server/errors';
import { parseQuantity } from '@/analysis/units/parse-quantity';
import type { StudyBlock } from '@/entities/study';
import type { CostView, SeasonView } from '@/app/_contracts/study-blocks';
import type { RunningCostExport } from '../exports';
import type { EntityManager } from '@mikro-orm/postgresql';
import type { LabRow } from '@/entities';
import { seasonSettings } from './season';
import { forecastSeason } from './forecasts';

/**
 * The cost-sheet block of a study (DOMAIN.md §6): a fuel or energy source with its price and
 * efficiency (COP for a heat pump), and the heat needed — taken from a forecast block's pool and
 * temperatures, from a pool volume and a rise, or given as an amount of useful heat — giving the
 * cost per useful therm and kWh, per degree of the pool and of the heat-up, through
 * analysis/cost (usefulHeatCost, costPerDegree) with the EIA heat contents of analysis/cost/fuels.
 */

export const FUEL_LABELS: Record<FuelKind, string> = {
  'natural-gas': 'Natural gas',
  propane: 'Propane',
  'electric-resistance': 'Electric resistance',
  'heat-pump': 'Heat pump',
  wood: 'Wood',
};

const unitText = z.string().max(60);
/** The settings of a cost block as stored (checked on save; the quantities are read when shown). */
export const costBlockData = z
  .object({
    fuel: z.enum(['natural-gas', 'propane', 'electric-resistance', 'heat-pump', 'wood']).optional(),
    price: z.number().min(0).max(1e6).nullable().optional(),
    currency: z.string().trim().max(8).optional(),
    efficiency: z.number().positive().max(10).nullable().optional(),
    heatFrom: z.enum(['forecast', 'pool', 'energy']).optional(),
    forecastBlockId: z.string().max(40).optional(),
    poolVolume: unitText.optional(),
    rise: unitText.optional(),
    heat: unitText.optional(),
    /** a season held at a target (season.ts): its energy, money and the payback of the build; reads the forecast block `forecastBlockId` */
    season: seasonSettings.optional(),
  })
  .strict();
export type CostBlockData = z.infer<typeof costBlockData>;

/** A bad or missing setting of a cost block: invalid input naming the field (the message begins with it). */
const bad = (field: string, message: string) => invalid(`${field}: ${message}`, { [field]: message });

/** Reads a setting; what the analysis refuses becomes invalid input naming the field. */
const mustRead = <T,>(field: string, f: () => T): T => {
  try {
    return readingInput(() => f());
  } catch (e) {
    if (e instanceof InputError) throw invalid(e.message, { [field]: e.message });
    throw e;
  }
};

/** Volume, °C at the middle of the heat-up and the rise, from a forecast block's settings. */
function fromForecast(block: StudyBlock | undefined) {
  if (!block || block.kind !== 'forecast') throw bad('forecastBlockId', 'pick a forecast block of this study for the heat needed.');
  const d = block.data;
  const volumeM3 = mustRead('forecastBlockId', () =>
    d.pool && typeof d.pool === 'object' ? readingInput((read) => poolGeometry(readPoolDimensions(read, d.pool, 'forecast pool'))).volumeM3 : parseQuantity(d.poolVolume, 'volume', 'forecast poolVolume'),
  );
  const startC = mustRead('forecastBlockId', () => parseQuantity(d.startTemp, 'temperature', 'forecast startTemp'));
  const targetC = mustRead('forecastBlockId', () => parseQuantity(d.targetTemp, 'temperature', 'forecast targetTemp'));
  if (!(targetC > startC)) throw invalid('The forecast block’s target is not above its start temperature: there is no heat-up to cost.', { forecastBlockId: 'its target is not above its start temperature' });
  return { volumeM3, midC: (startC + targetC) / 2, riseK: targetC - startC, basis: 'the forecast block’s pool from its start to its target temperature' };
}

/**
 * The numbers of a cost block.
 * @param blocks the study's blocks (a forecast block is looked up by `forecastBlockId`)
 * @throws DomainError (invalid) naming the field when a setting is missing or cannot be read.
 */
export function costView(data: Record<string, unknown>, blocks: readonly StudyBlock[] = []): CostView {
  const parsed = costBlockData.safeParse(data);
  if (!parsed.success) {
    const i = parsed.error.issues[0];
    throw bad(i?.path.join('.') || 'settings', i?.message ?? 'not valid');
  }
  const d = parsed.data;
  const fuel: FuelKind = d.fuel ?? 'propane';
  const info = FUELS[fuel];
  if (d.price == null) throw bad('price', `enter the price of ${FUEL_LABELS[fuel].toLowerCase()} per ${info.priceUnit}.`);
  const u = mustRead('efficiency', () => usefulHeatCost({ fuel, pricePerUnit: d.price!, efficiency: d.efficiency ?? undefined }));
  let volumeM3: number | null = null, riseK: number | null = null, midC = 25, heatJ: number, heatBasis: string;
  const from = d.heatFrom ?? 'pool';
  if (from === 'energy') {
    heatJ = mustRead('heat', () => parseQuantity(d.heat, 'energy', 'heat'));
    if (!(heatJ > 0)) throw bad('heat', 'give the useful heat needed, more than zero (e.g. "100 therm" or "500 kWh").');
    heatBasis = 'the useful heat given';
  } else {
    if (from === 'forecast') ({ volumeM3, midC, riseK, basis: heatBasis } = fromForecast(blocks.find((b) => b.id === d.forecastBlockId)));
    else {
      volumeM3 = mustRead('poolVolume', () => parseQuantity(d.poolVolume, 'volume', 'poolVolume'));
      riseK = mustRead('rise', () => parseQuantity(d.rise, 'temperatureDifference', 'rise'));
      if (!(riseK > 0)) throw bad('rise', 'give the temperature rise of the heat-up, more than zero.');
      heatBasis = 'the pool volume and rise given (water properties at 25 °C)';
    }
    if (!(volumeM3! > 0)) throw bad('poolVolume', 'the pool volume must be more than zero.');
    heatJ = energyPerDegreeJPerK(volumeM3!, midC) * riseK!;
  }
  const perDegree = volumeM3 ? costPerDegree(volumeM3, u.perUsefulTherm, midC) : null;
  return {
    fuel, fuelLabel: FUEL_LABELS[fuel], currency: d.currency || 'USD', price: d.price, priceUnit: info.priceUnit,
    efficiency: u.efficiency, efficiencyIsCop: fuel === 'heat-pump',
    perUsefulTherm: u.perUsefulTherm, perUsefulKWh: u.perUsefulKWh,
    heatBasis, volumeM3, riseK, perDegF: perDegree?.perDegF ?? null, perK: perDegree?.perK ?? null,
    heatJ, heatCost: (heatJ / USEFUL_THERM_J) * u.perUsefulTherm, fuelQuantity: heatJ / (u.heatContentJ * u.efficiency),
    source: info.source, cautions: costCautions(fuel, u.efficiency),
  };
}

/**
 * The season of a cost block, or null when it has none: the forecast block it names (its pool,
 * weather, cover factors and saved fit) held at the season's target, costed with the block's fuel.
 * @throws DomainError invalid naming the field (no forecast block, a bad season); InputError naming the forecast's field
 */
export async function costSeason(em: EntityManager, lab: LabRow, data: Record<string, unknown>, blocks: readonly StudyBlock[]): Promise<SeasonView | null> {
  const d = costBlockData.parse(data);
  if (!d.season) return null;
  const fb = seasonForecastBlock(d, blocks);
  const fuel: FuelKind = d.fuel ?? 'propane';
  if (d.price == null) throw bad('price', `enter the price of ${FUEL_LABELS[fuel].toLowerCase()} per ${FUELS[fuel].priceUnit}.`);
  return forecastSeason(em, lab, { ...fb.data }, d.season, { fuel, pricePerUnit: d.price, efficiency: d.efficiency ?? undefined, currency: d.currency || 'USD' });
}

/** The forecast block a season reads. @throws DomainError invalid naming forecastBlockId */
export function seasonForecastBlock(d: CostBlockData, blocks: readonly StudyBlock[]): StudyBlock {
  const fb = blocks.find((b) => b.id === d.forecastBlockId);
  if (!fb || fb.kind !== 'forecast') throw bad('forecastBlockId', 'pick a forecast block of this study: the season reads its pool, weather and heater.');
  return fb;
}

/** The cautions beside a running cost (DOMAIN.md §5, §6); our wording, deferring to local codes. */
export function costCautions(fuel: FuelKind, efficiency: number): string[] {
  const out = ['Running costs leave out the losses while the water heats (evaporation dominates; a cover saves 50–70 %): the real bill is higher. Heat contents are higher heating values (HHV).'];
  if (fuel === 'natural-gas' || fuel === 'propane') {
    out.push('Gas and propane pool heaters often reach only 50–75 % in the field against about 80 % in the laboratory; use your measured efficiency, or 0.7 when unsure.');
    if (efficiency > 0.9) out.push(`An efficiency of ${Math.round(efficiency * 100)} % is unusual for a heater that does not condense its flue gas: check it.`);
  }
  if (fuel === 'wood') out.push('A cord is a volume: about 20 million Btu is a rough estimate (species and moisture move it from about 15 to 32 million). Weigh the wood and read its moisture for a better figure.');
  if (fuel === 'heat-pump') {
    out.push('A heat pump’s COP falls as the air cools; most work efficiently only above about 7–10 °C (45–50 °F) air. Use your unit’s COP at your air temperature.');
    if (efficiency < 1 || efficiency > 7) out.push(`A COP of ${efficiency} is outside the usual 1–7: check it.`);
  }
  if (fuel === 'natural-gas' || fuel === 'propane' || fuel === 'wood') {
    out.push('Fuel-burning equipment makes carbon monoxide: run it outdoors only, away from openings, with a CO alarm nearby. Never heat a coil that cannot vent.');
  } else {
    out.push('Electrical equipment near a pool needs GFCI protection; follow your local electrical code.');
  }
  out.push('Emberline is an analysis aid, not a design approval: local codes and licensed professionals have the final word.');
  return out;
}

/** A cost block's numbers for the study workbook's Costs sheet. */
export function costExport(label: string, v: CostView): RunningCostExport {
  return {
    label, fuel: v.fuel as FuelKind, currency: v.currency, price: v.price, priceUnit: v.priceUnit, efficiency: v.efficiency,
    perUsefulTherm: v.perUsefulTherm, perUsefulKWh: v.perUsefulKWh, perDegF: v.perDegF, perK: v.perK,
    heatJ: v.heatJ, heatCost: v.heatCost, fuelQuantity: v.fuelQuantity, heatBasis: v.heatBasis,
    ...(v.season ? { season: v.season } : {}),
  };
}
