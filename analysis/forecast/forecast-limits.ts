/**
 * The bounds on one forecast's work, written once: the app's forecast route, a study's forecast
 * block (checked when it is saved and again when it runs), the spreadsheet export and the command
 * line all pass through {@link checkForecastWork}, so no input can make one forecast tie up a
 * process. The figures are ours: a leap year of hours at one-minute steps is about 0.2 s of CPU
 * on a 2-core machine (`npm run bench -- forecast` runs 180 days in ≈ 45 ms).
 */

/** Largest forecast one request may run. */
export const FORECAST_LIMITS = {
  /** horizon, h: a leap year */
  maxHours: 8784,
  /** shortest time step, s */
  minStepS: 10,
  /** longest time step, s (an hour: the weather table is hourly) */
  maxStepS: 3600,
  /** time steps in one forecast: a leap year of one-minute steps */
  maxSteps: 527_040,
  /** samples of the returned trajectory */
  maxSamples: 8785,
  /** rows of an hourly weather table */
  maxWeatherRows: 8784,
} as const;

/**
 * Refuses a forecast whose horizon, step or number of steps is beyond {@link FORECAST_LIMITS}.
 * @param hours horizon, h
 * @param stepS time step, s
 * @param sampleEveryS sampling interval of the trajectory, s
 * @throws RangeError naming the field and the limit.
 * @example checkForecastWork(24, 60, 3600) // 1440 steps
 */
export function checkForecastWork(hours: number, stepS: number, sampleEveryS = 3600): number {
  const L = FORECAST_LIMITS;
  if (hours > L.maxHours) throw new RangeError(`hours must be at most ${L.maxHours} (a leap year), got ${hours}`);
  if (stepS < L.minStepS) throw new RangeError(`step must be at least ${L.minStepS} s, got ${stepS} s`);
  if (stepS > L.maxStepS) throw new RangeError(`step must be at most ${L.maxStepS} s (one hour), got ${stepS} s`);
  const steps = Math.ceil((hours * 3600) / stepS - 1e-9);
  if (steps > L.maxSteps) {
    throw new RangeError(`hours / step gives ${steps} time steps; at most ${L.maxSteps} are allowed (a year of 1-minute steps): use a longer step or a shorter horizon`);
  }
  const samples = Math.ceil((hours * 3600) / Math.max(sampleEveryS, stepS)) + 1;
  if (samples > L.maxSamples) throw new RangeError(`the trajectory would have ${samples} samples; at most ${L.maxSamples} are allowed: sample less often`);
  return steps;
}
