/**
 * The body of POST /api/labs/:id/forecast from the form: every quantity as a string with the unit
 * the reader typed it in (analysis/units reads them on the server).
 */
import { displayUnit, displayUnits } from '@/app/_contracts/units';
import type { UnitSystem } from '@/analysis/units/unit-system';
import type { WeatherTable } from './weather-csv';

/** Hours of the day from `from` up to (not including) `to`, wrapping past midnight; from = to is all day. */
export function hoursBetween(from: number, to: number): number[] {
  const out: number[] = [];
  for (let h = from; out.length < 24; h = (h + 1) % 24) {
    if (out.length && h === to) break;
    out.push(h);
  }
  return out;
}

/** The choices of the form kept outside its inputs. */
export interface ForecastChoices {
  shape: string;
  losses: boolean;
  weatherMode: 'constant' | 'hourly';
  table: (WeatherTable & { name: string }) | null;
  /** ids of the saved collector fits (they take the sun inputs) */
  collectorFits?: string[];
}

/**
 * The request body, or the reason it cannot be sent (an hourly table that is missing or has errors).
 */
export function forecastBody(f: FormData, c: ForecastChoices, units: UnitSystem): { body: Record<string, unknown> } | { problem: string } {
  const u = displayUnits(units);
  const L = displayUnit('length', units).mathUnit;
  const T = u.temp.mathUnit;
  const v = (k: string) => String(f.get(k) ?? '').trim().replace(',', '.');
  const q = (k: string, unit: string) => (v(k) ? `${v(k)} ${unit}` : undefined);
  const pool: Record<string, unknown> = { shape: c.shape, depth: q('depth', L) };
  if (c.shape === 'round') pool.diameter = q('diameter', L);
  else Object.assign(pool, { length: q('length', L), width: q('width', L) });
  const hourly = c.weatherMode === 'hourly';
  const table = c.table;
  if (c.losses && hourly && !(table && table.rows.length && !table.issues.length)) {
    return { problem: 'Choose an hourly weather table without errors, or use constant weather.' };
  }
  const heaterHours = hoursBetween(Number(v('heaterFrom')), Number(v('heaterTo')));
  const body: Record<string, unknown> = {
    pool,
    startHour: Number(v('startHour')),
    ...(heaterHours.length < 24 ? { heaterHours } : {}),
    startTemp: q('startTemp', T),
    targetTemp: q('targetTemp', T),
    hours: Number(v('hours')),
    flow: q('flow', u.flow.mathUnit),
    thermostat: f.get('thermostat') === 'on' && !!v('targetTemp'),
    losses: c.losses
      ? {
          weather: hourly ? table!.rows : { airTemp: q('airTemp', T), relativeHumidity: Number(v('rh')) / 100, wind: q('wind', displayUnit('speed', units).mathUnit), solar: q('solar', 'W/m^2') },
          ...(f.get('cover') === 'on' ? { cover: { coveredHours: hoursBetween(Number(v('coverFrom')), Number(v('coverTo'))) } } : {}),
        }
      : false,
  };
  if (v('price')) body.cost = { fuel: v('fuel'), pricePerUnit: Number(v('price')), ...(v('efficiency') ? { efficiency: Number(v('efficiency')) } : {}), ...seasonOf(v, q, T) };
  const fitId = v('fitId');
  if (fitId) body.fitId = fitId;
  if (fitId && c.collectorFits?.includes(fitId)) body.sun = { irradiance: q('sunIrradiance', 'W/m^2'), ambientTemp: q('sunAir', T) };
  if (v('measuredEnd')) {
    body.measured = { endTemp: q('measuredEnd', T), thermometerU: q('thermometerU', u.tempDiff.mathUnit), volumeRelativeU: Number(v('volumeU') || '5') / 100 };
  }
  else body.heater = { model: 'coil', sourceTemp: q('ts', T), UA: q('ua', 'W/K') };
  return { body };
}

/** The season of the cost (cost.season), when its days are given: numbers as typed, the target with the reader's unit. */
function seasonOf(v: (k: string) => string, q: (k: string, unit: string) => string | undefined, T: string): { season?: Record<string, unknown> } {
  if (!v('seasonDays')) return {};
  const n = (k: string) => (v(k) ? Number(v(k)) : undefined);
  const purchased = v('purchasedPrice')
    ? { price: n('purchasedPrice'), ...(v('purchasedFuel') ? { fuel: v('purchasedFuel') } : {}), ...(v('purchasedFuelPrice') ? { fuelPrice: n('purchasedFuelPrice') } : {}), ...(v('purchasedEfficiency') ? { efficiency: n('purchasedEfficiency') } : {}) }
    : undefined;
  return {
    season: {
      days: n('seasonDays'), hoursPerDay: n('seasonHours'), targetTemp: q('seasonTarget', T) ?? '', cover: v('seasonCover') === 'on',
      ...(v('buildPrice') ? { buildPrice: n('buildPrice') } : {}), ...(purchased ? { purchased } : {}),
    },
  };
}
