/**
 * Steady-state criteria for segmenting logged trials, with the three presets of DOMAIN.md §2.4
 * (laboratory after ASHRAE 93 [12], collector after ISO 9806 as described in [11], field fires
 * and burners: our proposal). Every threshold is editable; the resolved criteria are returned
 * with each segment so they can be stored with the trial. SI throughout: K, s, m³/s.
 */

export type PresetName = 'laboratory' | 'collector' | 'field';

export interface SteadyCriteria {
  preset: PresetName | 'custom';
  /** sliding window over which slopes and tolerances are judged, s */
  windowS: number;
  /** |dTout/dt| limit, K/s (null: not judged) */
  maxOutletSlopeKPerS: number | null;
  /** |dTin/dt| limit, K/s (null: not judged) */
  maxInletSlopeKPerS: number | null;
  /** inlet within ± this of the mean, K (null: not judged) */
  inletTolK: number | null;
  /** …or ± this fraction of the mean in °C, whichever is greater (0: not used) */
  inletTolFraction: number;
  /** flow within ± this fraction of the mean (null: not judged) */
  flowTolFraction: number | null;
  /** …or ± this absolute flow, m³/s, whichever is greater */
  flowTolAbsM3PerS: number;
  /** coefficient of variation of flow over the window (null: not judged) */
  maxFlowCv: number | null;
  /** ambient within ± this of the mean, K (null: not judged) */
  ambientTolK: number | null;
  /** tolerances apply to moving averages over this many seconds (0: to the raw samples) */
  averagingS: number;
  /** block length for the block-mean check and the standard errors, s */
  blockS: number;
  /** whether every block mean must lie within the tolerances of the period mean (ISO 9806 style) */
  checkBlockMeans: boolean;
  /** shortest accepted period, s */
  minDurationS: number;
  /** time dropped from the start of every steady run (pre-conditioning / settling), s */
  settlingS: number;
  /** loop transit time (pipe volume / flow), s; null when unknown */
  transitTimeS: number | null;
  /** settling of at least this many transit times (field: 3, DOMAIN.md §2.4/§2.6) */
  settlingTransits: number;
  /** period of at least this many transit times (collector: 4, ISO 9806 [11]) */
  minDurationTransits: number;
  /** a step in time longer than this is a gap that ends a segment, s (null: 5 × median interval) */
  maxGapS: number | null;
}

/** 0.005 US gpm in m³/s (gallon = 231 in³ = 3.785411784 L exactly, NIST SP 811 B.8). */
const GPM_0_005 = (0.005 * 3.785411784e-3) / 60;

/** Presets as DOMAIN.md §2.4 suggests them. */
export const PRESETS: Record<PresetName, SteadyCriteria> = {
  // ASHRAE 93 [12]: Tin ±2 % or ±1.0 °C, flow ±2 % or ±0.005 gpm, ambient ±1.5 °C, dTout/dt < 0.05 °C/min, 15 min
  laboratory: {
    preset: 'laboratory', windowS: 300, maxOutletSlopeKPerS: 0.05 / 60, maxInletSlopeKPerS: null,
    inletTolK: 1.0, inletTolFraction: 0.02, flowTolFraction: 0.02, flowTolAbsM3PerS: GPM_0_005, maxFlowCv: null,
    ambientTolK: 1.5, averagingS: 0, blockS: 30, checkBlockMeans: false, minDurationS: 900, settlingS: 0,
    transitTimeS: null, settlingTransits: 0, minDurationTransits: 0, maxGapS: null,
  },
  // ISO 9806 [11]: flow ±1 %, Tin ±0.1 K, ambient ±1.5 K (from memory), 30-s means against the period mean, ≥ 15 min and ≥ 4 transit times.
  // The outlet slope limit is ours (the lab preset's 0.05 K/min): the summary in DOMAIN.md §2.4 lists no outlet
  // criterion, and without one a warming outlet after a flow step would pass as steady.
  collector: {
    preset: 'collector', windowS: 300, maxOutletSlopeKPerS: 0.05 / 60, maxInletSlopeKPerS: null,
    inletTolK: 0.1, inletTolFraction: 0, flowTolFraction: 0.01, flowTolAbsM3PerS: 0, maxFlowCv: null,
    ambientTolK: 1.5, averagingS: 30, blockS: 30, checkBlockMeans: true, minDurationS: 900, settlingS: 0,
    transitTimeS: null, settlingTransits: 0, minDurationTransits: 4, maxGapS: null,
  },
  // fires and burners (our proposal, DOMAIN.md §2.4): |dTout/dt| < 0.1–0.2 K/min (0.15 taken), flow CV < 2 %, ≥ 5 min after ≥ 3 transit times
  field: {
    preset: 'field', windowS: 120, maxOutletSlopeKPerS: 0.15 / 60, maxInletSlopeKPerS: null,
    inletTolK: null, inletTolFraction: 0, flowTolFraction: null, flowTolAbsM3PerS: 0, maxFlowCv: 0.02,
    ambientTolK: null, averagingS: 10, blockS: 30, checkBlockMeans: false, minDurationS: 300, settlingS: 0,
    transitTimeS: null, settlingTransits: 3, minDurationTransits: 0, maxGapS: null,
  },
};

/**
 * Bounds on edited times and counts (ours): the segmenter's work grows with the log's length over
 * the block, and a day covers every test we know; so a request cannot make it count blocks
 * without end.
 */
export const CRITERIA_LIMITS = { minTimeS: 1, maxTimeS: 86_400, maxTransits: 1000 } as const;

/**
 * A preset with edits; the result is checked (windows and blocks of 1 s to a day, non-negative
 * tolerances, times at most a day, transit counts at most 1000).
 * @throws RangeError naming the bad threshold and echoing it
 * @example resolveCriteria('field', { maxOutletSlopeKPerS: 0.2 / 60 })
 */
export function resolveCriteria(preset: PresetName, edits: Partial<Omit<SteadyCriteria, 'preset'>> = {}): SteadyCriteria {
  const base = PRESETS[preset];
  if (!base) throw new RangeError(`unknown preset ${JSON.stringify(preset)} (laboratory, collector or field)`);
  const edited = Object.keys(edits).some((k) => (edits as Record<string, unknown>)[k] !== undefined && (edits as Record<string, unknown>)[k] !== (base as unknown as Record<string, unknown>)[k]);
  const c: SteadyCriteria = { ...base, ...stripUndefined(edits), preset: edited ? 'custom' : preset };
  const positive: (keyof SteadyCriteria)[] = ['windowS', 'blockS', 'minDurationS'];
  for (const k of positive) {
    const v = c[k] as number;
    if (typeof v !== 'number' || !Number.isFinite(v) || v <= 0) throw new RangeError(`${k} must be a number greater than 0, got ${typeof v === 'number' ? String(v) : JSON.stringify(v)}`);
    if (v < CRITERIA_LIMITS.minTimeS || v > CRITERIA_LIMITS.maxTimeS) throw new RangeError(`${k} must be between ${CRITERIA_LIMITS.minTimeS} s and ${CRITERIA_LIMITS.maxTimeS} s (a day), got ${v}`);
  }
  const nonNeg: (keyof SteadyCriteria)[] = [
    'maxOutletSlopeKPerS', 'maxInletSlopeKPerS', 'inletTolK', 'inletTolFraction', 'flowTolFraction', 'flowTolAbsM3PerS',
    'maxFlowCv', 'ambientTolK', 'averagingS', 'settlingS', 'transitTimeS', 'settlingTransits', 'minDurationTransits', 'maxGapS',
  ];
  for (const k of nonNeg) {
    const v = c[k];
    if (v === null) continue;
    if (typeof v !== 'number' || !Number.isFinite(v) || v < 0) throw new RangeError(`${k} must be a number of 0 or more (or null), got ${typeof v === 'number' ? String(v) : JSON.stringify(v)}`);
  }
  for (const k of ['averagingS', 'settlingS', 'transitTimeS', 'maxGapS'] as const) {
    const v = c[k];
    if (typeof v === 'number' && v > CRITERIA_LIMITS.maxTimeS) throw new RangeError(`${k} must be at most ${CRITERIA_LIMITS.maxTimeS} s (a day), got ${v}`);
  }
  for (const k of ['settlingTransits', 'minDurationTransits'] as const) {
    if (c[k] > CRITERIA_LIMITS.maxTransits) throw new RangeError(`${k} must be at most ${CRITERIA_LIMITS.maxTransits}, got ${c[k]}`);
  }
  return c;
}

function stripUndefined<T extends object>(o: T): Partial<T> {
  const out: Partial<T> = {};
  for (const [k, v] of Object.entries(o)) if (v !== undefined) (out as Record<string, unknown>)[k] = v;
  return out;
}
