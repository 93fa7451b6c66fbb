/**
 * Which trials of a steady-state collector test are valid points, after the test conditions of
 * ISO 9806 as DOMAIN.md §2.4 and §4 describe them:
 * - ISO 9806-1:1994 steady-state test as described by Kalogirou [11]: irradiance above 800 W/m²,
 *   wind 2–4 m/s, flow stable within ±1 % during a test and within ±10 % between tests, at least
 *   1.5 K temperature rise for a valid point, at least four inlet temperatures, the first within
 *   ±3 K of ambient, and at least four points per inlet temperature;
 * - the permitted deviations from the period mean (from memory — DOMAIN.md §2.4 asks to verify
 *   them against the standard): irradiance ±50 W/m², surrounding air ±1.5 K, flow ±1 %, inlet ±0.1 K.
 * Later editions (ISO 9806:2013/2017) changed some of these (from memory: a lower irradiance floor);
 * the limits are options so a lab can set the ones of the edition it follows.
 *
 * A trial is excluded when its temperature rise is below the minimum, or when its per-trial spread
 * (largest deviation from the period mean, when given) exceeds a permitted deviation. Irradiance,
 * wind, flow between tests and the spread of inlet temperatures are test conditions: they give
 * warnings, not exclusions, so a backyard test still gets its curve with the departures stated.
 */

/** The steadiness limits and test conditions (SI). */
export interface CollectorTestLimits {
  /** permitted deviation of irradiance from the period mean, W/m² */
  irradianceDeviationWPerM2: number;
  /** permitted deviation of the surrounding air temperature, K */
  ambientDeviationK: number;
  /** permitted deviation of the flow, fraction of the flow */
  flowDeviationRelative: number;
  /** permitted deviation of the inlet temperature, K */
  inletDeviationK: number;
  /** smallest temperature rise of a valid point, K */
  minTemperatureRiseK: number;
  /** smallest irradiance in the collector plane, W/m² */
  minIrradianceWPerM2: number;
  /** wind speed range over the collector, m/s */
  windMPerS: [number, number];
  /** flows of all trials within this fraction of their median */
  flowBetweenTestsRelative: number;
  /** distinct inlet temperatures across the test */
  minInletTemperatures: number;
  /** the lowest inlet within this many K of ambient */
  firstInletNearAmbientK: number;
}

/** The limits above: ISO 9806-1:1994 as described in DOMAIN.md §2.4 [11]; deviations from memory. */
export const ISO9806_STEADY_LIMITS: Readonly<CollectorTestLimits> = Object.freeze({
  irradianceDeviationWPerM2: 50,
  ambientDeviationK: 1.5,
  flowDeviationRelative: 0.01,
  inletDeviationK: 0.1,
  minTemperatureRiseK: 1.5,
  minIrradianceWPerM2: 800,
  windMPerS: [2, 4] as [number, number],
  flowBetweenTestsRelative: 0.1,
  minInletTemperatures: 4,
  firstInletNearAmbientK: 3,
});

/** Largest deviation of each quantity from its period mean during one trial (any may be absent). */
export interface CollectorTrialSpread {
  irradianceWPerM2?: number;
  ambientTempK?: number;
  inletTempK?: number;
  /** fraction of the trial's flow */
  flowRelative?: number;
}

/** What the check needs of one trial. */
export interface SteadinessTrial {
  irradianceWPerM2: number;
  inletTempC: number;
  outletTempC: number;
  ambientTempC: number;
  /** any flow measure, only compared between trials (m³/s or kg/s) */
  flow: number;
  windMPerS?: number;
  spread?: CollectorTrialSpread;
}

/**
 * Reasons each trial is excluded (an empty list keeps it) and warnings on the test conditions.
 * @param trials the trials, SI
 * @param limits the limits (default {@link ISO9806_STEADY_LIMITS})
 * @returns `reasons[i]` for trial i, and `warnings` on the whole test
 * @example collectorSteadiness([{ irradianceWPerM2: 950, inletTempC: 25, outletTempC: 31, ambientTempC: 22, flow: 3.3e-5 }]).reasons // [[]]
 */
export function collectorSteadiness(trials: SteadinessTrial[], limits: CollectorTestLimits = ISO9806_STEADY_LIMITS): { reasons: string[][]; warnings: string[] } {
  const L = limits;
  const reasons = trials.map((t) => {
    const r: string[] = [];
    const rise = t.outletTempC - t.inletTempC;
    if (rise < L.minTemperatureRiseK) r.push(`temperature rise ${rise.toFixed(2)} K is below the ${L.minTemperatureRiseK} K of a valid point`);
    const s = t.spread ?? {};
    const over = (v: number | undefined, lim: number) => v !== undefined && Math.abs(v) > lim;
    // the measured spread in words: three significant digits (a logged period's spread has many more)
    const said = (v: number | undefined) => String(Number((v as number).toPrecision(3)));
    if (over(s.irradianceWPerM2, L.irradianceDeviationWPerM2)) r.push(`irradiance varied by ${said(s.irradianceWPerM2)} W/m² (limit ±${L.irradianceDeviationWPerM2})`);
    if (over(s.ambientTempK, L.ambientDeviationK)) r.push(`ambient temperature varied by ${said(s.ambientTempK)} K (limit ±${L.ambientDeviationK})`);
    if (over(s.inletTempK, L.inletDeviationK)) r.push(`inlet temperature varied by ${said(s.inletTempK)} K (limit ±${L.inletDeviationK})`);
    if (over(s.flowRelative, L.flowDeviationRelative)) r.push(`flow varied by ${(100 * (s.flowRelative as number)).toFixed(2)} % (limit ±${100 * L.flowDeviationRelative} %)`);
    return r;
  });
  const warnings: string[] = [];
  const kept = trials.filter((_, i) => reasons[i].length === 0);
  const low = kept.filter((t) => t.irradianceWPerM2 < L.minIrradianceWPerM2).length;
  if (low > 0) warnings.push(`${low} trial(s) below the ${L.minIrradianceWPerM2} W/m² irradiance of the steady-state test conditions`);
  const windy = kept.filter((t) => t.windMPerS !== undefined && (t.windMPerS < L.windMPerS[0] || t.windMPerS > L.windMPerS[1])).length;
  if (windy > 0) warnings.push(`${windy} trial(s) outside the ${L.windMPerS[0]}–${L.windMPerS[1]} m/s wind of the test conditions`);
  if (kept.length > 0) {
    const flows = kept.map((t) => t.flow).sort((a, b) => a - b);
    const median = flows[Math.floor((flows.length - 1) / 2)] / 2 + flows[Math.ceil((flows.length - 1) / 2)] / 2;
    const off = kept.filter((t) => Math.abs(t.flow / median - 1) > L.flowBetweenTestsRelative).length;
    if (off > 0) warnings.push(`${off} trial(s) with a flow more than ${100 * L.flowBetweenTestsRelative} % from the median flow of the test`);
    const inlets = distinctWithin(kept.map((t) => t.inletTempC), 1);
    if (inlets.length < L.minInletTemperatures) warnings.push(`only ${inlets.length} distinct inlet temperature(s) (within 1 K); the test asks for at least ${L.minInletTemperatures} spread over the operating range`);
    const thin = inlets.filter((v) => kept.filter((t) => t.inletTempC >= v && t.inletTempC <= v + 1).length < 4).length;
    if (thin > 0) warnings.push(`${thin} inlet temperature(s) with fewer than 4 points; the test asks for at least 4 at each`);
    const lowest = kept.reduce((a, t) => (t.inletTempC < a.inletTempC ? t : a));
    if (Math.abs(lowest.inletTempC - lowest.ambientTempC) > L.firstInletNearAmbientK) warnings.push(`the lowest inlet temperature is ${Math.abs(lowest.inletTempC - lowest.ambientTempC).toFixed(1)} K from ambient; the test asks for one within ±${L.firstInletNearAmbientK} K`);
  }
  return { reasons, warnings };
}

/**
 * Distinct settings: the sorted values, a value counted as new when it is more than `tol` above the
 * last one kept.
 * @example distinctWithin([20, 20.4, 35, 50.2], 1) // [20, 35, 50.2]
 */
export function distinctWithin(values: number[], tol: number): number[] {
  const s = values.slice().sort((a, b) => a - b);
  const out: number[] = [];
  for (const v of s) if (out.length === 0 || v - out[out.length - 1] > tol) out.push(v);
  return out;
}
