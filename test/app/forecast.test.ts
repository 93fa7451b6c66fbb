import { describe, expect, test } from 'vitest';
import { signedIn } from './support/client';
import { forecastPlot } from '../../app/_plots';
import { plotToSvg } from '../../app/_lib/plots/plot-svg';

/** The trajectory as the page draws it: the answer's numbers through the one builder (app/_plots), rendered as the server would. */
const trajectorySvg = (body: { plots: { trajectory: { input: Parameters<typeof forecastPlot>[0] } } }) => plotToSvg(forecastPlot(body.plots.trajectory.input, 'si').options);

describe('forecast API', () => {
  test('the loss-free recirculating case matches the exact solution of DOMAIN.md §3.3 (check value #13)', async () => {
    const v = await signedIn('viewer@cinder-hollow.test');
    const lab = (await v.get('/api/me')).body.labs[0];
    // DOMAIN.md §8 #13 (computed): 15,000 gal (M = 56,588 kg), Ts 90 °C, UA 500 W/K, 0.2 kg/s, from 20 °C, no losses, 24 h → 28.98 °C.
    const r = await v.post(`/api/labs/${lab.id}/forecast`, {
      poolMass: '56588 kg',
      startTemp: '20 degC',
      hours: 24,
      flow: `${0.2 / 998.2} m^3/s`,
      heater: { model: 'coil', sourceTemp: '90 degC', UA: '500 W/K' },
      losses: false,
    });
    expect(r.status, r.text).toBe(200);
    expect(r.body.finalTemp_degC).toBeCloseTo(28.98, 1);
    expect(trajectorySvg(r.body)).toMatch(/^<svg/);
    // the page draws it: the answer carries numbers, not server SVG
    expect(r.body.plots.trajectory).not.toHaveProperty('svg');
    // the outlet of a 90 °C source is above the scald limits: the result says so (DOMAIN.md §5)
    expect(r.body.cautions.map((c: { code: string }) => c.code)).toContain('scald');
  });

  test('a pool given by its shape in feet, with weather losses and a night cover', async () => {
    const v = await signedIn('viewer@cinder-hollow.test');
    const lab = (await v.get('/api/me')).body.labs[0];
    const r = await v.post(`/api/labs/${lab.id}/forecast`, {
      pool: { shape: 'round', diameter: '15 ft', depth: '4 ft' },
      startTemp: '68 degF',
      targetTemp: '80 degF',
      hours: 72,
      flow: '3 gpm',
      heater: { model: 'coil', sourceTemp: '90 degC', UA: '500 W/K' },
      losses: { weather: { airTemp: '22 degC', relativeHumidity: 0.6, wind: '1 m/s', solar: '150 W/m^2' }, cover: { coveredHours: [0, 1, 2, 3, 4, 5, 22, 23] } },
    });
    expect(r.status, r.text).toBe(200);
    // DOMAIN.md §8 #5: round 15 ft × 4 ft is 5,288 gal exact
    expect(r.body.pool.volume_m3 / 3.785411784e-3).toBeCloseTo(5288, -1);
    expect(r.body.finalTemp_degC).toBeGreaterThan(20);
  });

  test('a unit that does not fit the quantity is refused with the field named', async () => {
    const v = await signedIn('viewer@cinder-hollow.test');
    const lab = (await v.get('/api/me')).body.labs[0];
    const r = await v.post(`/api/labs/${lab.id}/forecast`, { poolVolume: '15000 gal', startTemp: '20 degC', hours: 24, flow: '5 kg', heater: { model: 'coil', sourceTemp: '90 degC', UA: '500 W/K' }, losses: false });
    expect(r.status).toBe(422);
    expect(r.body.message).toMatch(/flow/);
  });
});

describe('forecast extras', () => {
  test('rise per hour by flow × pool size and the cost per degree with EIA factors', async () => {
    const v = await signedIn('viewer@cinder-hollow.test');
    const lab = (await v.get('/api/me')).body.labs[0];
    const r = await v.post(`/api/labs/${lab.id}/forecast`, {
      poolVolume: '15000 gal',
      startTemp: '20 degC',
      hours: 24,
      flow: '12 L/min',
      heater: { model: 'coil', sourceTemp: '90 degC', UA: '500 W/K' },
      losses: false,
      cost: { fuel: 'propane', pricePerUnit: 3, efficiency: 0.82 },
    });
    expect(r.status, r.text).toBe(200);
    expect(r.body.riseTable.risePerHourK).toHaveLength(4);
    // more flow warms faster; a bigger pool slower (DOMAIN.md §1.2, §3.2)
    expect(r.body.riseTable.risePerHourK[3][1]).toBeGreaterThan(r.body.riseTable.risePerHourK[0][1]);
    expect(r.body.riseTable.risePerHourK[1][2]).toBeLessThan(r.body.riseTable.risePerHourK[1][0]);
    // DOMAIN.md §6 table (EIA factors, computed): propane $3.00/gal at η 0.82 → $4.00 per useful therm, $5.00 per °F for 15,000 gal
    expect(r.body.cost.perUsefulTherm).toBeCloseTo(4.0, 1);
    expect(r.body.cost.perDegF).toBeCloseTo(5.0, 1);
  });
});

describe('long forecasts', () => {
  test('a 100-day series is reduced for display to at most 2,000 points (largest-triangle-three-buckets)', async () => {
    const v = await signedIn('viewer@cinder-hollow.test');
    const lab = (await v.get('/api/me')).body.labs[0];
    const r = await v.post(`/api/labs/${lab.id}/forecast`, {
      poolVolume: '15000 gal', startTemp: '20 degC', hours: 2400, flow: '12 L/min',
      heater: { model: 'coil', sourceTemp: '90 degC', UA: '500 W/K' },
      losses: { surfaceArea: '46 m^2', weather: { airTemp: '20 degC', relativeHumidity: 0.6, wind: '1 m/s' } },
    });
    expect(r.status, r.text).toBe(200);
    expect(r.body.samples).toBeGreaterThan(2000);
    expect(r.body.shownSamples).toBeLessThanOrEqual(2000);
    expect(r.body.plots.trajectory.input.timeH.length).toBe(r.body.shownSamples);
    expect(trajectorySvg(r.body)).not.toMatch(/NaN/);
  });
});
