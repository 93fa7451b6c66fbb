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

  test('a measured day: the residual against the loss-free exact solution (check value #13), the unmodelled gain r·M·cp and its uncertainty, and a verdict', async () => {
    const v = await signedIn('viewer@cinder-hollow.test');
    const lab = (await v.get('/api/me')).body.labs[0];
    const body = { poolMass: '56588 kg', startTemp: '20 degC', hours: 24, flow: `${0.2 / 998.2} m^3/s`, heater: { model: 'coil', sourceTemp: '90 degC', UA: '500 W/K' }, losses: false };
    // DOMAIN.md §8 #13: the forecast ends at 28.98 °C; the pool was measured at 30.0 °C
    const r = await v.post(`/api/labs/${lab.id}/forecast`, { ...body, measured: { endTemp: '30 degC', thermometerU: '0.2 K', volumeRelativeU: 0.01 } });
    expect(r.status, r.text).toBe(200);
    const d = r.body.measuredDay;
    expect(d.predictedEndTemp_degC).toBeCloseTo(28.98, 1);
    expect(d.residual_K).toBeCloseTo(30 - d.predictedEndTemp_degC, 9);
    // G = r·M·cp with cp of water near 29.5 °C, 4,178 J/(kg·K) within 0.1 % (IAPWS-IF97, from memory)
    expect(d.unmodelledGain_J / (d.residual_K * 56588 * 4178)).toBeCloseTo(1, 2);
    expect(d.unmodelledGainU_J).toBeGreaterThan(0);
    expect(d.significant).toBe(true);
    expect(d.verdict).toMatch(/more than the forecast/);
    // the pool's volume carries the prediction too: at ±5 % (the heat spread over more or less water,
    // ∂Tpred/∂M = −(Ts − T0)·e^(−t/τ)·(t/τ)/M for the exact solution) the same 1 K is within the measurement
    const loose = await v.post(`/api/labs/${lab.id}/forecast`, { ...body, measured: { endTemp: '30 degC', thermometerU: '0.2 K', volumeRelativeU: 0.05 } });
    expect(loose.body.measuredDay.significant).toBe(false);
    expect(loose.body.measuredDay.verdict).toMatch(/^Within the measurement uncertainty/);
    // with the target given, the hours a day that hold it: no losses, so none
    const held = await v.post(`/api/labs/${lab.id}/forecast`, { ...body, targetTemp: '28 degC' });
    expect(held.body.holdHoursPerDay_h).toBe(0);
    const bad = await v.post(`/api/labs/${lab.id}/forecast`, { ...body, measured: { endTemp: '30 degC', volumeRelativeU: 2 } });
    expect(bad.status).toBe(422);
    expect(bad.body.message).toMatch(/volume uncertainty is at most 50 %/);
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

describe('filling a tub in one pass through the heater', () => {
  // DOMAIN.md §1.2 worked table (ε-NTU, Cr → 0, computed): Ts 90 °C, Tin 20 °C, UA 500 W/K, ṁ 0.1 kg/s → Tout 68.80 °C
  // (cp 4,186); at 6 L/min of water the app's IF97 cp and density move it by under 0.1 K.
  test('fill time V/Q, the final temperature of the outlet water, the flow for a 38 °C tub, and the spa cautions above 40 °C', async () => {
    const v = await signedIn('viewer@cinder-hollow.test');
    const lab = (await v.get('/api/me')).body.labs[0];
    const r = await v.post(`/api/labs/${lab.id}/tub-fill`, { heater: { sourceTemp: '90 degC', UA: '500 W/K' }, tubVolume: '1200 L', flow: '6 L/min', supplyTemp: '20 degC', targetTemp: '38 degC' });
    expect(r.status, r.text).toBe(200);
    expect(r.body.fillTimeS).toBeCloseTo(1200 / 6 * 60, 6);
    expect(r.body.outletTempC).toBeCloseTo(68.8, 0);
    expect(r.body.finalTempC).toBeCloseTo(r.body.outletTempC, 9); // an empty tub ends at the outlet temperature
    // a 69 °C tub is far above the 40 °C limit for tubs (DOMAIN.md §5): the tub's own caution is there
    expect(r.body.cautions.some((c: { where: string; level: string }) => c.where === 'tub' && c.level === 'danger')).toBe(true);
    // the flow for 38 °C: UA/(ρ·cp·ln((Ts − Tin)/(Ts − T))) (DOMAIN.md §1.6, the minimum-flow formula for a limit)
    const expected = 500 / (998 * 4180 * Math.log(70 / 52));
    expect(r.body.target.flowM3PerS / expected).toBeCloseTo(1, 2);
    const dead = await v.post(`/api/labs/${lab.id}/tub-fill`, { heater: { sourceTemp: '90 degC', UA: '500 W/K' }, tubVolume: '1200 L', flow: '0 L/min', supplyTemp: '20 degC' });
    expect(dead.status).toBe(422);
    expect(dead.body.fields.flow).toMatch(/more than 0/);
  });
});
