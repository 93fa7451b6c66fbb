/**
 * Segments a sensor log into steady trials (DOMAIN.md §2.6, our design on the criteria of §2.4):
 * 1. split at gaps in the time base;
 * 2. slide a window of `windowS` and mark its samples steady where the outlet (and inlet) slope,
 *    the inlet / flow / ambient deviations from the window mean and the flow CV are within the
 *    criteria (tolerances on `averagingS` moving averages);
 * 3. in each steady run drop the settling time, cut the run where a channel drifts beyond its
 *    tolerance of the running period mean (so a period never exceeds it as a whole);
 * 4. keep pieces of at least the minimum duration whose block means (if asked) hold, report the
 *    rest with the reason.
 * O(n) with a few passes over typed arrays: a million samples take tens of milliseconds.
 */
import { resolveCriteria, type PresetName, type SteadyCriteria } from './steady-criteria';
import { segmentStats, blockMeans, type LogChannels, type SegmentStats } from './segment-stats';
import { SLICE, SlidingSum, centredMeanSteps } from './window-sums';

export interface SteadySegment extends SegmentStats {
  startIndex: number;
  /** inclusive */
  endIndex: number;
  startTimeS: number;
  endTimeS: number;
  durationS: number;
  /** the largest deviation of each judged channel from the period mean (of the averaged series) */
  maxDeviation: { inletK: number; flowFraction: number; ambientK: number | null };
  /** the criteria this segment was found with, to store with the trial */
  criteria: SteadyCriteria;
}

export interface RejectedRun {
  startIndex: number;
  endIndex: number;
  startTimeS: number;
  endTimeS: number;
  reason: string;
}

export interface Gap {
  /** index of the last sample before the gap */
  afterIndex: number;
  gapS: number;
}

export interface SegmentationResult {
  segments: SteadySegment[];
  rejected: RejectedRun[];
  gaps: Gap[];
  criteria: SteadyCriteria;
  /** the gap threshold used, s */
  maxGapS: number;
}

function checkChannels(log: LogChannels): number {
  const n = log.timeS.length;
  const names: (keyof LogChannels)[] = ['inletTempC', 'outletTempC', 'flowM3PerS', 'ambientTempC'];
  for (const k of names) {
    const a = log[k];
    if (a === undefined || a === null) { if (k === 'ambientTempC') continue; throw new TypeError(`${k} is required (an array of numbers)`); }
    if (a.length !== n) throw new RangeError(`${k} has ${a.length} samples but timeS has ${n}`);
  }
  for (const k of ['timeS', ...names] as (keyof LogChannels)[]) {
    const a = log[k];
    if (!a) continue;
    for (let i = 0; i < n; i++) if (!Number.isFinite(a[i])) throw new RangeError(`${k}[${i}] is ${a[i]}, not a finite number`);
  }
  for (let i = 1; i < n; i++) if (!(log.timeS[i] > log.timeS[i - 1])) throw new RangeError(`timeS must increase: timeS[${i}] = ${log.timeS[i]} after ${log.timeS[i - 1]}`);
  return n;
}

function medianInterval(t: ArrayLike<number>): number {
  const m = Math.min(t.length - 1, 10001);
  const d = new Float64Array(m);
  for (let i = 0; i < m; i++) d[i] = t[i + 1] - t[i];
  d.sort();
  return d[Math.floor(m / 2)];
}

/** Sliding max/min of `x` over windows whose start only moves forward (a monotonic deque). */
class Extremum {
  private q: Int32Array;
  private h = 0;
  private e = 0;
  constructor(n: number, private x: ArrayLike<number>, private max: boolean) { this.q = new Int32Array(n); }
  reset() { this.h = 0; this.e = 0; }
  push(i: number) {
    const x = this.x, v = x[i];
    while (this.e > this.h && (this.max ? x[this.q[this.e - 1]] <= v : x[this.q[this.e - 1]] >= v)) this.e--;
    this.q[this.e++] = i;
  }
  value(start: number): number {
    while (this.q[this.h] < start) this.h++;
    return this.x[this.q[this.h]];
  }
}

/**
 * Finds the steady segments of a log.
 * @param log time (s, strictly increasing), inlet and outlet (°C), flow (m³/s), optional ambient (°C)
 * @param criteria a preset name or resolved criteria (see resolveCriteria for edits)
 * @throws TypeError / RangeError for unequal lengths, non-finite samples or time that does not increase
 * @example segmentLog({ timeS, inletTempC, outletTempC, flowM3PerS }, 'field').segments.map((s) => s.mean.outletTempC)
 */
export function segmentLog(log: LogChannels, criteria: PresetName | SteadyCriteria = 'laboratory'): SegmentationResult {
  const steps = segmentLogSteps(log, criteria);
  for (;;) {
    const r = steps.next();
    if (r.done) return r.value;
  }
}

/**
 * `segmentLog` in slices: a generator that pauses every 65,536 samples of its long passes, so that
 * a caller can give the event loop a turn between slices (the sensor import keeps its COPY
 * flowing meanwhile). Run to the end, it returns exactly what `segmentLog` returns.
 * @throws as segmentLog, from the `next()` call that meets the problem
 * @example
 *   const steps = segmentLogSteps(log, 'field');
 *   let r = steps.next();
 *   while (!r.done) { await new Promise((go) => setImmediate(go)); r = steps.next(); }
 *   r.value.segments
 */
export function* segmentLogSteps(log: LogChannels, criteria: PresetName | SteadyCriteria = 'laboratory'): Generator<void, SegmentationResult, void> {
  const c = typeof criteria === 'string' ? resolveCriteria(criteria) : criteria;
  const n = checkChannels(log);
  const t = log.timeS, tin = log.inletTempC, tout = log.outletTempC, q = log.flowM3PerS;
  const amb = log.ambientTempC ?? null;
  if (n < 3) return { segments: [], rejected: [], gaps: [], criteria: c, maxGapS: c.maxGapS ?? 0 };

  // 1. gaps
  const maxGapS = c.maxGapS ?? 5 * medianInterval(t);
  const gaps: Gap[] = [];
  const spanStart = new Int32Array(n);
  for (let i = 1; i < n; i++) {
    if (t[i] - t[i - 1] > maxGapS) { gaps.push({ afterIndex: i - 1, gapS: t[i] - t[i - 1] }); spanStart[i] = i; }
    else spanStart[i] = spanStart[i - 1];
  }

  // 2. steady mask from sliding windows
  const sIn = yield* centredMeanSteps(t, tin, c.averagingS, spanStart);
  const sQ = yield* centredMeanSteps(t, q, c.averagingS, spanStart);
  const sAmb = amb && c.ambientTolK !== null ? yield* centredMeanSteps(t, amb, c.averagingS, spanStart) : null;
  const t0 = t[0], o0 = tout[0], i0 = tin[0], q0 = q[0];
  const needOut = c.maxOutletSlopeKPerS !== null, needInSlope = c.maxInletSlopeKPerS !== null;
  const sumT = new SlidingSum(t, t0), sumTT = new SlidingSum(t, t0, t, t0);
  const sumO = needOut ? new SlidingSum(tout, o0) : null, sumTO = needOut ? new SlidingSum(t, t0, tout, o0) : null;
  const sumI = needInSlope ? new SlidingSum(tin, i0) : null, sumTI = needInSlope ? new SlidingSum(t, t0, tin, i0) : null;
  const sumSIn = c.inletTolK !== null ? new SlidingSum(sIn, i0) : null;
  const sumSQ = c.flowTolFraction !== null ? new SlidingSum(sQ, q0) : null;
  const sumSAmb = sAmb ? new SlidingSum(sAmb, sAmb[0]) : null;
  const sumQ = c.maxFlowCv !== null ? new SlidingSum(q, q0) : null, sumQQ = c.maxFlowCv !== null ? new SlidingSum(q, q0, q, q0) : null;
  const sums = [sumT, sumTT, sumO, sumTO, sumI, sumTI, sumSIn, sumSQ, sumSAmb, sumQ, sumQQ].filter((w): w is SlidingSum => w !== null);
  // sliding extremes only for the channels judged by tolerance (each deque is n ints)
  const inMax = sumSIn ? new Extremum(n, sIn, true) : null, inMin = sumSIn ? new Extremum(n, sIn, false) : null;
  const qMax = sumSQ ? new Extremum(n, sQ, true) : null, qMin = sumSQ ? new Extremum(n, sQ, false) : null;
  const aMax = sAmb ? new Extremum(n, sAmb, true) : null, aMin = sAmb ? new Extremum(n, sAmb, false) : null;
  const paint = new Int32Array(n + 1);

  /** least-squares slope of y over the window of k samples, from the window sums */
  const slopeOf = (Y: SlidingSum, TY: SlidingSum, k: number): number => {
    const St = sumT.sum, Stt = sumTT.sum;
    const Sy = Y.sum, Sty = TY.sum;
    const sxx = Stt - (St * St) / k;
    return sxx > 0 ? (Sty - (St * Sy) / k) / sxx : 0;
  };

  // the window is [s, i]; the loop runs in slices (a plain function, which V8 optimises as it runs)
  let windowStart = 0;
  const scan = (from: number, to: number) => {
    let s = windowStart;
    for (let i = from; i < to; i++) {
      if (spanStart[i] === i) {
        s = i;
        for (const w of sums) w.restart();
        inMax?.reset(); inMin?.reset(); qMax?.reset(); qMin?.reset(); aMax?.reset(); aMin?.reset();
      }
      for (const w of sums) w.add(i);
      inMax?.push(i); inMin?.push(i); qMax?.push(i); qMin?.push(i); aMax?.push(i); aMin?.push(i);
      while (s < i && t[i] - t[s + 1] >= c.windowS) { for (const w of sums) w.drop(s); s++; }
      if (t[i] - t[s] < c.windowS) continue;
      const k = i - s + 1;
      if (sumO && Math.abs(slopeOf(sumO, sumTO!, k)) > c.maxOutletSlopeKPerS!) continue;
      if (sumI && Math.abs(slopeOf(sumI, sumTI!, k)) > c.maxInletSlopeKPerS!) continue;
      if (sumSIn) {
        const mean = sumSIn.sum / k + i0;
        const tol = Math.max(c.inletTolK!, c.inletTolFraction * Math.abs(mean));
        if (inMax!.value(s) - mean > tol || mean - inMin!.value(s) > tol) continue;
      }
      if (sumSQ) {
        const mean = sumSQ.sum / k + q0;
        const tol = Math.max(c.flowTolFraction! * Math.abs(mean), c.flowTolAbsM3PerS);
        if (qMax!.value(s) - mean > tol || mean - qMin!.value(s) > tol) continue;
      }
      if (sumQ) {
        const sq = sumQ.sum;
        const mean = sq / k + q0;
        const v = Math.max(0, (sumQQ!.sum - (sq * sq) / k) / (k - 1));
        if (!(mean > 0) || Math.sqrt(v) / mean > c.maxFlowCv!) continue;
      }
      if (sumSAmb) {
        const mean = sumSAmb.sum / k + sAmb![0];
        if (aMax!.value(s) - mean > c.ambientTolK! || mean - aMin!.value(s) > c.ambientTolK!) continue;
      }
      paint[s]++; paint[i + 1]--;
    }
    windowStart = s;
  };
  for (let from = 0; from < n; from += SLICE) {
    if (from > 0) yield;
    scan(from, Math.min(n, from + SLICE));
  }

  // 3–4. runs → pieces → segments
  const segments: SteadySegment[] = [];
  const rejected: RejectedRun[] = [];
  const transit = c.transitTimeS ?? 0;
  const settling = Math.max(c.settlingS, c.settlingTransits * transit);
  const minDur = Math.max(c.minDurationS, c.minDurationTransits * transit);
  const reject = (a: number, b: number, reason: string) => rejected.push({ startIndex: a, endIndex: b, startTimeS: t[a], endTimeS: t[b], reason });

  let depth = 0, runStart = -1;
  const runs = (from: number, to: number) => {
    for (let i = from; i < to; i++) {
      const steady = i < n && (depth += paint[i]) > 0 && (runStart < 0 || spanStart[i] === spanStart[runStart]);
      if (steady && runStart < 0) { runStart = i; continue; }
      if (!steady && runStart >= 0) {
        handleRun(runStart, i - 1);
        runStart = -1;
        if (i < n && depth > 0) runStart = i; // a new span starts steady right after a gap
      }
    }
  };
  for (let from = 0; from <= n; from += SLICE) {
    if (from > 0) yield;
    runs(from, Math.min(n + 1, from + SLICE));
  }

  function handleRun(a0: number, b: number) {
    let a = a0;
    while (a <= b && t[a] - t[a0] < settling) a++;
    if (a > b || t[b] - t[a] < minDur) {
      reject(a0, b, `steady for ${fmt(t[b] - t[a0])} s${settling ? ` (${fmt(settling)} s settling dropped)` : ''}, shorter than the minimum ${fmt(minDur)} s`);
      return;
    }
    // cut where a channel drifts beyond its tolerance of the running mean
    let start = a;
    let sumIn = 0, sumQ = 0, sumA = 0, k = 0, hiIn = -Infinity, loIn = Infinity, hiQ = -Infinity, loQ = Infinity, hiA = -Infinity, loA = Infinity;
    const restart = (j: number) => { start = j; sumIn = sumQ = sumA = 0; k = 0; hiIn = hiQ = hiA = -Infinity; loIn = loQ = loA = Infinity; };
    for (let j = a; j <= b + 1; j++) {
      let drift = j > b;
      if (!drift) {
        k++; sumIn += sIn[j]; sumQ += sQ[j]; if (sAmb) sumA += sAmb[j];
        hiIn = Math.max(hiIn, sIn[j]); loIn = Math.min(loIn, sIn[j]); hiQ = Math.max(hiQ, sQ[j]); loQ = Math.min(loQ, sQ[j]);
        if (sAmb) { hiA = Math.max(hiA, sAmb[j]); loA = Math.min(loA, sAmb[j]); }
        const mIn = sumIn / k, mQ = sumQ / k, mA = sumA / k;
        if (c.inletTolK !== null && Math.max(hiIn - mIn, mIn - loIn) > Math.max(c.inletTolK, c.inletTolFraction * Math.abs(mIn))) drift = true;
        if (c.flowTolFraction !== null && Math.max(hiQ - mQ, mQ - loQ) > Math.max(c.flowTolFraction * Math.abs(mQ), c.flowTolAbsM3PerS)) drift = true;
        if (sAmb && Math.max(hiA - mA, mA - loA) > c.ambientTolK!) drift = true;
      }
      if (drift) {
        const end = j - 1;
        if (end >= start) piece(start, end, j <= b);
        if (j <= b) { restart(j); j--; } // re-examine sample j as the first of the next piece
        if (j > b) break;
      }
    }
  }

  function piece(a: number, b: number, cut: boolean) {
    const dur = t[b] - t[a];
    if (dur < minDur) {
      reject(a, b, `${cut ? 'a channel drifts beyond its tolerance after' : 'steady for'} ${fmt(dur)} s, shorter than the minimum ${fmt(minDur)} s`);
      return;
    }
    const st = segmentStats(log, a, b, c.blockS);
    const mIn = st.mean.inletTempC, mQ = st.mean.flowM3PerS, mA = st.mean.ambientTempC;
    if (c.checkBlockMeans) {
      const why = blockFailure(a, b, mIn, mQ, mA);
      if (why) { reject(a, b, why); return; }
    }
    let devIn = 0, devQ = 0, devA = 0;
    for (let i = a; i <= b; i++) {
      devIn = Math.max(devIn, Math.abs(sIn[i] - mIn));
      devQ = Math.max(devQ, Math.abs(sQ[i] - mQ));
      if (sAmb && mA !== null) devA = Math.max(devA, Math.abs(sAmb[i] - mA));
    }
    segments.push({
      startIndex: a, endIndex: b, startTimeS: t[a], endTimeS: t[b], durationS: dur, ...st,
      maxDeviation: { inletK: devIn, flowFraction: mQ !== 0 ? devQ / Math.abs(mQ) : Infinity, ambientK: sAmb ? devA : null },
      criteria: c,
    });
  }

  function blockFailure(a: number, b: number, mIn: number, mQ: number, mA: number | null): string | null {
    if (c.inletTolK !== null) {
      const tol = Math.max(c.inletTolK, c.inletTolFraction * Math.abs(mIn));
      const worst = Math.max(...blockMeans(t, tin, a, b, c.blockS).map((x) => Math.abs(x - mIn)));
      if (worst > tol) return `a ${fmt(c.blockS)}-s mean of the inlet is ${fmt(worst)} K from the period mean (limit ${fmt(tol)} K)`;
    }
    if (c.flowTolFraction !== null) {
      const tol = Math.max(c.flowTolFraction * Math.abs(mQ), c.flowTolAbsM3PerS);
      const worst = Math.max(...blockMeans(t, q, a, b, c.blockS).map((x) => Math.abs(x - mQ)));
      if (worst > tol) return `a ${fmt(c.blockS)}-s mean of the flow is ${fmt((worst / Math.abs(mQ)) * 100)} % from the period mean (limit ${fmt((tol / Math.abs(mQ)) * 100)} %)`;
    }
    if (amb && c.ambientTolK !== null && mA !== null) {
      const worst = Math.max(...blockMeans(t, amb, a, b, c.blockS).map((x) => Math.abs(x - mA)));
      if (worst > c.ambientTolK) return `a ${fmt(c.blockS)}-s mean of the ambient is ${fmt(worst)} K from the period mean (limit ${fmt(c.ambientTolK)} K)`;
    }
    return null;
  }

  return { segments, rejected, gaps, criteria: c, maxGapS };
}

function fmt(x: number): string {
  return String(Math.round(x * 100) / 100);
}
