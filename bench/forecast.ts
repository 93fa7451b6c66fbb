/**
 * Benchmark: a season of 1-minute steps (180 days ≈ 259,200 steps) of the recirculating forecast
 * with every loss term on, an hourly weather table, a cover schedule and heater hours.
 * Prints the run times; the last line is the headline figure.
 */
import { recirculatingForecast } from '../analysis/forecast/recirculating-forecast';
import { coilHeater } from '../analysis/performance/heater-model';

const day = Array.from({ length: 24 }, (_, h) => ({
  airTempC: 18 + 7 * Math.sin(((h - 9) / 24) * 2 * Math.PI),
  relativeHumidity: 0.55 + 0.2 * Math.cos(((h - 4) / 24) * 2 * Math.PI),
  windMPerS: 1 + 0.8 * Math.sin(((h - 12) / 24) * 2 * Math.PI) ** 2,
  solarWPerM2: Math.max(0, 850 * Math.sin(((h - 6) / 12) * Math.PI)),
  cloudCover: 0.3,
}));

const input = {
  poolVolumeM3: 56.8, startTempC: 18, hours: 180 * 24, stepS: 60, flowM3PerS: 2e-4,
  heater: coilHeater({ sourceTempC: 90, uaWPerK: 500 }),
  heaterHours: [8, 9, 10, 11, 12, 13, 14, 15, 16, 17],
  targetTempC: 28,
  losses: {
    weather: day, surfaceAreaM2: 46.6,
    evaporation: { activityFactor: 1, correction: 0.8 },
    convection: {}, radiation: {}, solar: { absorptance: 0.85 },
    walls: { areaM2: 30, uWPerM2K: 1.5, groundTempC: 15 },
    cover: { coveredHours: [0, 1, 2, 3, 4, 5, 6, 21, 22, 23] },
  },
};

const times: number[] = [];
let last = recirculatingForecast(input);
for (let i = 0; i < 12; i++) {
  const t0 = process.hrtime.bigint();
  last = recirculatingForecast(input);
  times.push(Number(process.hrtime.bigint() - t0) / 1e6);
}
times.sort((a, b) => a - b);
console.log(`steps per run: ${last.steps}; final ${last.finalTempC.toFixed(2)} °C; equilibrium ${last.equilibriumTempC?.toFixed(2)} °C; hours to 28 °C: ${last.hoursToTarget?.toFixed(1)}`);
console.log(`runs: ${times.map((t) => t.toFixed(1)).join(', ')} ms`);
console.log(`forecast, season of 1-min steps with all loss terms: median ${times[times.length >> 1].toFixed(1)} ms (target < 100 ms)`);
