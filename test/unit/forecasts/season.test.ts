/**
 * A season's energy, money and payback (app/_lib/forecasts/season.ts) against closed forms worked
 * here by hand: losses × days / efficiency, the fuel's EIA heat content (DOMAIN.md §6 [24]) and
 * simple payback = extra capital / saving a season. The losses are made closed-form by switching
 * every term off but one: wall conduction U·A·(T − T_ground), or convection with McAdams'
 * h = 5.7 + 3.8·V W/(m²·K) (DOMAIN.md §3.4, from memory), or the sun's absorptance × area × G.
 */
import { describe, expect, test } from 'vitest';
import { computeSeason } from '../../../app/_lib/forecasts/forecast-compute';
import { DomainError } from '../../../app/_lib/server/errors';

const BTU_J = 1055.05585262; // Btu_IT (NIST SP 811)
const THERM_J = 100_000 * BTU_J;
const PROPANE_GAL_J = 91_452 * BTU_J; // EIA [24]
const WOOD_CORD_J = 20e6 * BTU_J; // EIA [24], a rough figure

/** A 40 m³ pool with a 40 m² surface and only the named loss terms, heated by a coil at 12 L/min. */
function body(losses: Record<string, unknown>): Record<string, unknown> {
  return {
    poolVolume: '40 m^3', startTemp: '20 degC', hours: 24, flow: '12 L/min',
    heater: { model: 'coil', sourceTemp: '88 degC', UA: '430 W/K' },
    losses: { surfaceArea: '40 m^2', weather: { airTemp: '20 degC', relativeHumidity: 0.5, wind: '0 m/s', solar: '0 W/m^2' }, evaporation: false, convection: false, radiation: false, solar: false, ...losses },
  };
}
// walls only: 50 m² × 2 W/(m²·K) × (28 − 15) K = 1,300 W at a 28 °C target
const WALLS = { walls: { area: '50 m^2', U: '2 W/(m^2*K)', groundTemp: '15 degC' } };
const wood = { fuel: 'wood' as const, pricePerUnit: 250, efficiency: 0.3, currency: 'USD' };
const season = (extra: Record<string, unknown> = {}) => ({ days: 120, hoursPerDay: 8, targetTemp: '28 degC', cover: false, ...extra });

function refusal(f: () => unknown): { message: string; fields: Record<string, string> } {
  try {
    f();
  } catch (e) {
    if (e instanceof DomainError) return { message: e.message, fields: (e.details.fields ?? {}) as Record<string, string> };
    throw e;
  }
  throw new Error('expected a refusal');
}

describe('the season’s heat and fuel', () => {
  test('walls only: useful heat = U·A·ΔT × 24 h × days; fuel = heat / η in cords, kWh and therms (closed form)', () => {
    const s = computeSeason({ body: body(WALLS), season: season(), build: wood });
    expect(s.lossW).toBeCloseTo(1300, 9);
    expect(s.solarW).toBeCloseTo(0, 9);
    const useful = 1300 * 86_400 * 120;
    expect(s.usefulJ).toBeCloseTo(useful, 0);
    expect(s.fuelJ).toBeCloseTo(useful / 0.3, 0);
    expect(s.fuelUnit).toBe('cord');
    expect(s.fuelUnits).toBeCloseTo(useful / 0.3 / WOOD_CORD_J, 9);
    expect(s.fuelKWh).toBeCloseTo(useful / 0.3 / 3.6e6, 6);
    expect(s.fuelTherms).toBeCloseTo(useful / 0.3 / THERM_J, 9);
    expect(s.annualCost).toBeCloseTo((useful / 0.3 / WOOD_CORD_J) * 250, 6);
    // the DOE template's hours with the season's: 8 h × 120 days burner, 24 h × 120 days pool (10 CFR 430 App. P structure [17])
    expect(s.burnerHours).toBe(960);
    expect(s.poolHours).toBe(2880);
    expect(s.limitedByHeater).toBe(false);
    // the hours that hold it: 24 h × losses / heater heat at the target (the forecast's own rule)
    expect(s.holdHoursPerDay!).toBeCloseTo((24 * 1300) / s.heaterW, 9);
    expect(s.payback).toBeNull();
  });

  test('a heat pump buys useful heat / COP of electricity, priced per kWh (DOMAIN.md §6)', () => {
    const s = computeSeason({ body: body(WALLS), season: season(), build: { fuel: 'heat-pump', pricePerUnit: 0.15, efficiency: 4, currency: 'USD' } });
    const kWh = (1300 * 86_400 * 120) / 4 / 3.6e6;
    expect(s.fuelUnit).toBe('kWh');
    expect(s.fuelUnits).toBeCloseTo(kWh, 6);
    expect(s.annualCost).toBeCloseTo(kWh * 0.15, 6);
  });

  test('the cover on outside 8 heater hours scales convection by 1 − f + f·c with f = 16/24 (McAdams h = 5.7 W/(m²·K) in still air)', () => {
    const conv = { convection: { model: 'mcadams' }, cover: { coveredHours: [], convectionFactor: 0.5 } };
    const open = computeSeason({ body: body(conv), season: season(), build: wood });
    expect(open.lossW).toBeCloseTo(40 * 5.7 * 8, 9);
    const covered = computeSeason({ body: body(conv), season: season({ cover: true }), build: wood });
    expect(covered.lossW).toBeCloseTo(40 * 5.7 * 8 * (1 - 16 / 24 + (16 / 24) * 0.5), 9);
  });

  test('the sun’s gain (absorptance 0.85 × 40 m² × 20 W/m²) comes off the losses; a sun that outweighs them needs no heat', () => {
    const sunny = (g: number) => body({ ...WALLS, solar: { absorptance: 0.85 }, weather: { airTemp: '20 degC', relativeHumidity: 0.5, solar: `${g} W/m^2` } });
    const s = computeSeason({ body: sunny(20), season: season(), build: wood });
    expect(s.solarW).toBeCloseTo(0.85 * 40 * 20, 9);
    expect(s.usefulJ).toBeCloseTo((1300 - 680) * 86_400 * 120, 0);
    const none = computeSeason({ body: sunny(200), season: season({ buildPrice: 500, purchased: { price: 2000, efficiency: 0.82, fuel: 'propane', fuelPrice: 3 } }), build: wood });
    expect(none.usefulJ).toBe(0);
    expect(none.payback!.years).toBeNull();
    expect(none.payback!.verdict).toMatch(/^Never: the season needs no heat/);
  });

  test('an hour a day of a weak heater delivers what it can: heater heat × hours × days, flagged', () => {
    const s = computeSeason({ body: body({ walls: { area: '50 m^2', U: '100 W/(m^2*K)', groundTemp: '15 degC' } }), season: season({ hoursPerDay: 1 }), build: wood });
    expect(s.limitedByHeater).toBe(true);
    expect(s.usefulJ).toBeCloseTo(s.heaterW * 3600 * 120, 0);
    expect(s.notes.join(' ')).toMatch(/cannot replace the mean losses/);
  });

  test('the season reads its own weather and surface when the forecast has neither (a volume-only forecast block)', () => {
    const plain = { poolVolume: '40 m^3', startTemp: '20 degC', hours: 24, flow: '12 L/min', heater: { model: 'coil', sourceTemp: '88 degC', UA: '430 W/K' }, losses: false };
    const s = computeSeason({ body: plain, season: season({ weather: { airTemp: '20 degC', relativeHumidity: 0.5 }, surfaceArea: '40 m^2' }), build: wood });
    expect(s.lossW).toBeGreaterThan(0);
    expect(refusal(() => computeSeason({ body: plain, season: season(), build: wood })).fields).toHaveProperty('season');
    expect(refusal(() => computeSeason({ body: plain, season: season({ weather: { airTemp: '20 degC', relativeHumidity: 0.5 } }), build: wood })).fields).toHaveProperty(['season.surfaceArea']);
  });
});

describe('payback of the build against a purchased heater', () => {
  const useful = 1300 * 86_400 * 120;
  const woodPerTherm = (250 * THERM_J) / (WOOD_CORD_J * 0.3); // = 250 / (200 × 0.3), DOMAIN.md §6
  const propanePerTherm = (p: number) => (p * THERM_J) / (PROPANE_GAL_J * 0.82); // = 1.0935 p / 0.82

  test('years = (build − purchase) / (therms × (c_other − c_build)) (simple payback, closed form)', () => {
    const s = computeSeason({ body: body(WALLS), season: season({ buildPrice: 1500, purchased: { price: 1000, fuel: 'propane', fuelPrice: 3.5, efficiency: 0.82 } }), build: wood });
    const p = s.payback!;
    expect(woodPerTherm).toBeCloseTo(250 / 60, 9);
    expect(p.perUsefulThermBuild).toBeCloseTo(woodPerTherm, 9);
    expect(p.perUsefulThermPurchased).toBeCloseTo(propanePerTherm(3.5), 9);
    const saving = (useful / THERM_J) * (propanePerTherm(3.5) - woodPerTherm);
    expect(p.annualSaving).toBeCloseTo(saving, 6);
    expect(p.years!).toBeCloseTo(500 / saving, 9);
    expect(p.buildBasis).toBe('the build price given');
    expect(p.verdict).toMatch(/seasons: the build's extra 500\.00 USD/);
  });

  test('the build cost from its items with tax (cents summed exactly) and "never" when the build runs dearer', () => {
    const items = [{ subassembly: 'coil', description: 'copper tube', quantity: 2, unitCost: 48.5 }, { subassembly: 'labour', description: 'hours', quantity: 10, unitCost: 20, taxable: false }];
    const s = computeSeason({ body: body(WALLS), season: season({ buildItems: items, taxRate: 0.08, purchased: { price: 2000, fuel: 'heat-pump', fuelPrice: 0.15, efficiency: 5 } }), build: wood });
    const p = s.payback!;
    // 97.00 + 200.00 + 8 % of 97.00 = 304.76
    expect(p.buildCost).toBeCloseTo(304.76, 9);
    // heat pump $0.15/kWh at COP 5: $0.879 per useful therm (check value #16), cheaper than wood's 4.17
    expect(p.perUsefulThermPurchased).toBeCloseTo(0.879, 3);
    expect(p.years).toBeNull();
    expect(p.verdict).toMatch(/^Never: the build costs 1695\.24 USD less up front/);
  });

  test('cheaper to build and cheaper to run: pays back at once', () => {
    const s = computeSeason({ body: body(WALLS), season: season({ buildPrice: 300, purchased: { price: 2500, fuel: 'propane', fuelPrice: 3.5, efficiency: 0.82 } }), build: wood });
    expect(s.payback!.years).toBe(0);
    expect(s.payback!.verdict).toMatch(/^At once/);
  });

  test('a purchased heater on another fuel needs its fuel price; a build cost is needed', () => {
    const e = refusal(() => computeSeason({ body: body(WALLS), season: season({ buildPrice: 300, purchased: { price: 2500, fuel: 'propane', efficiency: 0.82 } }), build: wood }));
    expect(e.fields).toHaveProperty(['season.purchased.fuelPrice']);
    const f = refusal(() => computeSeason({ body: body(WALLS), season: season({ purchased: { price: 2500, efficiency: 0.82 } }), build: wood }));
    expect(f.fields).toHaveProperty(['season.buildPrice']);
    // the editor's new comparison has no price yet
    const g = refusal(() => computeSeason({ body: body(WALLS), season: season({ buildPrice: 300, purchased: { price: null } }), build: wood }));
    expect(g.fields).toHaveProperty(['season.purchased.price']);
  });

  test('the rig’s build cost stands in when the season gives none', () => {
    const s = computeSeason({ body: body(WALLS), season: season({ purchased: { price: 100, fuel: 'propane', fuelPrice: 3.5 } }), build: { ...wood, rigBuild: { amount: 180, rig: 'Coil A' } } });
    expect(s.payback!.buildCost).toBe(180);
    expect(s.payback!.buildBasis).toBe('the build cost of the rig "Coil A"');
    // propane's default efficiency 0.82 (FUELS, DOMAIN.md §6) when the purchased heater gives none
    expect(s.payback!.purchasedEfficiency).toBe(0.82);
  });
});

describe('bad settings name the field', () => {
  test.each([
    [{ days: 400 }, 'season.days', /at most 366 days/],
    [{ days: 0 }, 'season.days', /at least 1 day/],
    [{ hoursPerDay: 25 }, 'season.hoursPerDay', /at most 24/],
    [{ targetTemp: '' }, 'season.targetTemp', /target temperature/],
    [{ purchased: { price: -1, efficiency: 0.8 } }, 'season.purchased.price', /not negative/],
    [{ extra: 1 }, 'season', /unknown setting extra/],
  ])('%o → %s', (patch, field, message) => {
    const e = refusal(() => computeSeason({ body: body(WALLS), season: season(patch), build: wood }));
    expect(Object.keys(e.fields ?? {})).toEqual([field]);
    expect(e.message).toMatch(message);
    expect(e.message.startsWith(field)).toBe(true);
  });

  test('a target outside 1–60 °C is refused with its field', () => {
    const e = refusal(() => computeSeason({ body: body(WALLS), season: season({ targetTemp: '90 degC' }), build: wood }));
    expect(e.fields).toHaveProperty(['season.targetTemp']);
  });
});
