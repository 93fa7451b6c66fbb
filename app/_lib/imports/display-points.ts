/**
 * The display points of a log: which samples a plot shows and how they are rounded. No
 * `server-only`: the segmentation preview runs in the analysis worker threads. sensor-overview.ts
 * (the stored overview) re-exports these.
 */
import { DISPLAY_MAX_POINTS, overviewIndices } from '@/analysis/reduce';
import type { OverviewPoints } from '@/entities/sensor-overview';

/** The channels of a log as the import holds them: seconds from the first sample, SI values. */
export interface OverviewChannels {
  timeS: ArrayLike<number>;
  inletTempC: ArrayLike<number>;
  outletTempC: ArrayLike<number>;
  flowM3PerS: ArrayLike<number>;
  /** the air beside the rig, when logged (NaN where a sample has none) */
  ambientTempC?: ArrayLike<number> | null;
  /** a collector log's irradiance in the collector plane, W/m² */
  irradianceWPerM2?: ArrayLike<number> | null;
}

/**
 * The channels whose extremes the display keeps: the water's always, and the sun's for a
 * collector log (a passing cloud must stay visible). Ambient is drawn, not reduced on.
 */
export function reducedChannels(ch: OverviewChannels): ArrayLike<number>[] {
  return [ch.inletTempC, ch.outletTempC, ch.flowM3PerS, ...(ch.irradianceWPerM2?.length ? [ch.irradianceWPerM2] : [])];
}

// Plenty for a plot, and it keeps the stored JSON (and the page) small: 7 significant digits, times to 1 ms.
export const sig = (v: number): number | null => (Number.isFinite(v) ? Number(v.toPrecision(7)) : null);
export const ms = (s: number) => Math.round(s * 1000) / 1000;

/**
 * The display points of a log's channels: at most `maxPoints` samples on one time base, the
 * union of each channel's LTTB-with-extremes indices (analysis/reduce `overviewIndices`), times to
 * 1 ms and readings to 7 significant digits (null where a reading is missing).
 * @throws as overviewIndices (a channel of another length, decreasing time).
 */
export function displayPoints(ch: OverviewChannels, maxPoints = DISPLAY_MAX_POINTS): OverviewPoints {
  return pointsAt(ch, ch.timeS.length ? overviewIndices(ch.timeS, reducedChannels(ch), maxPoints) : new Uint32Array(0));
}

/** The display points at the given sample indices. */
export function pointsAt(ch: OverviewChannels, idx: ArrayLike<number>): OverviewPoints {
  const at = <T,>(f: (i: number) => T) => Array.from(idx, f);
  const amb = ch.ambientTempC?.length ? ch.ambientTempC : null;
  const irr = ch.irradianceWPerM2?.length ? ch.irradianceWPerM2 : null;
  return {
    tS: at((i) => ms(ch.timeS[i])),
    inletTempC: at((i) => sig(ch.inletTempC[i])),
    outletTempC: at((i) => sig(ch.outletTempC[i])),
    flowM3PerS: at((i) => sig(ch.flowM3PerS[i])),
    // only logs that have them carry the air and the sun (coil logs' overviews stay as they were)
    ...(amb ? { ambientTempC: at((i) => sig(amb[i])) } : {}),
    ...(irr ? { irradianceWPerM2: at((i) => sig(irr[i])) } : {}),
  };
}
