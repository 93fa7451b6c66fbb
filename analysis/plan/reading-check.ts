/**
 * Checks of a test session as readings come in, small and dependency-free so that the phone page
 * runs the same rule as the server:
 * - a reading is checked against the planned run's prediction interval, moved to the inlet
 *   actually read (the plan's sensitivity of the outlet to the inlet, `inletSlope`); a reading
 *   outside is questioned, never refused (the person at the rig decides);
 * - the drift check compares the reference runs: the rise of a later reference against the first
 *   one's, re-referenced through the effectiveness ε = (Tout − Tin)/(Ts − Tin) when the source
 *   temperature is known (DOMAIN.md §0.2, §1.2), against the expanded uncertainty of a difference
 *   of two rises, U = k·2u with k = 2 (each rise holds an outlet and an inlet reading of standard
 *   uncertainty u: u(rise) = √2·u, u(difference) = 2u; JCGM 100:2008 §5.1, §6.3).
 */

/** What the plan says of one run. */
export interface RunPrediction {
  predictedOutletTempC: number;
  piLowC: number;
  piHighC: number;
  /** ∂(outlet)/∂(inlet) at the run's flow (coil: 1 − ε; exp-inlet: 1; exp-approach: 0) */
  inletSlope: number;
  /** the inlet the prediction was made at, °C */
  planInletTempC: number;
}

/** The verdict on one reading. */
export interface ReadingCheck {
  inside: boolean;
  /** prediction and interval at the inlet read, °C */
  predictedOutletTempC: number;
  piLowC: number;
  piHighC: number;
  /** reading − prediction, K */
  deviationK: number;
  message: string;
}

const f1 = (x: number) => x.toFixed(1);

/**
 * @param run the planned run's prediction
 * @param reading the inlet and outlet read, °C
 * @throws RangeError for a non-finite number
 * @example checkReading({ predictedOutletTempC: 40, piLowC: 38, piHighC: 42, inletSlope: 0.6, planInletTempC: 15 }, { inletTempC: 15, outletTempC: 45 }).inside // false
 */
export function checkReading(run: RunPrediction, reading: { inletTempC: number; outletTempC: number }): ReadingCheck {
  const named: Record<string, number> = {
    predictedOutletTempC: run.predictedOutletTempC, piLowC: run.piLowC, piHighC: run.piHighC, inletSlope: run.inletSlope,
    planInletTempC: run.planInletTempC, inletTempC: reading.inletTempC, outletTempC: reading.outletTempC,
  };
  for (const [k, v] of Object.entries(named)) if (!Number.isFinite(v)) throw new RangeError(`${k} must be a finite number, got ${String(v)}`);
  const shift = run.inletSlope * (reading.inletTempC - run.planInletTempC);
  const y = run.predictedOutletTempC + shift, lo = run.piLowC + shift, hi = run.piHighC + shift;
  const inside = reading.outletTempC >= lo && reading.outletTempC <= hi;
  const d = reading.outletTempC - y;
  const message = inside
    ? `Within the predicted ${f1(lo)}–${f1(hi)} °C.`
    : `${f1(reading.outletTempC)} °C is ${d > 0 ? 'above' : 'below'} the predicted ${f1(lo)}–${f1(hi)} °C: check the thermometer is in the stream and the flow is as set, then read again or keep it.`;
  return { inside, predictedOutletTempC: y, piLowC: lo, piHighC: hi, deviationK: d, message };
}

/** A reference reading: the same flow set again. */
export interface ReferenceReading {
  inletTempC: number;
  outletTempC: number;
}

/** The drift verdict of a session. */
export interface DriftCheck {
  /** fewer than two reference readings: nothing to compare */
  ready: boolean;
  /** outlet of each later reference minus what the first predicts for its inlet, K */
  driftsK: number[];
  /** the largest of them in size, K (0 when not ready) */
  driftK: number;
  /** expanded uncertainty of one comparison, k = 2, K */
  expandedUK: number;
  drifted: boolean;
  message: string;
}

/**
 * @param refs the reference readings in the order they were taken
 * @param measurementUK standard uncertainty of one temperature reading, K
 * @param sourceTempC the source temperature Ts when known (re-references through ε); else the rise is compared as it is
 * @throws RangeError for a u that is not positive
 * @example driftCheck([{ inletTempC: 15, outletTempC: 60 }, { inletTempC: 15, outletTempC: 55 }], 0.5).drifted // true
 */
export function driftCheck(refs: readonly ReferenceReading[], measurementUK: number, sourceTempC?: number | null): DriftCheck {
  if (!(measurementUK > 0) || !Number.isFinite(measurementUK)) throw new RangeError(`measurementUK must be a positive number, got ${String(measurementUK)}`);
  const U = 2 * 2 * measurementUK;
  if (refs.length < 2) return { ready: false, driftsK: [], driftK: 0, expandedUK: U, drifted: false, message: 'The drift check needs the reference flow a second time.' };
  const [first, ...later] = refs;
  const rise0 = first.outletTempC - first.inletTempC;
  const ts = sourceTempC ?? null;
  const driftsK = later.map((r) => {
    const scale = ts !== null && ts - first.inletTempC > 1 && ts - r.inletTempC > 1 ? (ts - r.inletTempC) / (ts - first.inletTempC) : 1;
    return r.outletTempC - (r.inletTempC + rise0 * scale);
  });
  const driftK = driftsK.reduce((m, d) => (Math.abs(d) > Math.abs(m) ? d : m), 0);
  const drifted = Math.abs(driftK) > U;
  const message = drifted
    ? `The reference flow now gives ${f1(Math.abs(driftK))} K ${driftK < 0 ? 'less' : 'more'} than at the start, more than the ${f1(U)} K the thermometers can explain: the source has drifted (a fire burning down, a tank warming). Note it; the fit will carry it as scatter.`
    : `The reference flow agrees with the start within ${f1(U)} K (largest difference ${f1(Math.abs(driftK))} K): no drift the thermometers can show.`;
  return { ready: true, driftsK, driftK, expandedUK: U, drifted, message };
}
