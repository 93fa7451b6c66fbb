import { defineEntity, p } from '@mikro-orm/core';
import { baseProperties, num } from './base';
import { Rig } from './rig';
import { SourceFile } from './source-file';

/** Reduced channels of a log on one time base: seconds from `startedAt`, SI values, null = no reading. */
export interface OverviewPoints {
  tS: number[];
  inletTempC: (number | null)[];
  outletTempC: (number | null)[];
  flowM3PerS: (number | null)[];
  /** the air beside the rig, when the log has it */
  ambientTempC?: (number | null)[];
  /** a collector log's irradiance in the collector plane, W/m² */
  irradianceWPerM2?: (number | null)[];
}

/** A steady segment of the log, seconds from `startedAt`, with its channel means (SI). */
export interface OverviewSegment {
  startS: number;
  endS: number;
  inletTempC: number;
  outletTempC: number;
  flowM3PerS: number;
}

/**
 * The display overview of one imported sensor log: at most `maxPoints` samples chosen by LTTB
 * with each channel's extremes and the endpoints (analysis/reduce/channel-overview.ts), and the
 * steady segments. Written in the import's transaction (or built once from `sensor_sample` for a
 * log imported before), so that a study never reads a million samples to draw one plot.
 */
export const SensorOverview = defineEntity({
  name: 'SensorOverview',
  tableName: 'sensor_overview',
  properties: {
    ...baseProperties(),
    sourceFile: () => p.oneToOne(SourceFile).owner().unique().deleteRule('cascade'),
    rig: () => p.manyToOne(Rig).deleteRule('cascade'),
    /** time of the first sample */
    startedAt: p.datetime().columnType('timestamptz'),
    /** samples in the log */
    samples: p.integer(),
    durationS: num(),
    /** the display budget the points were reduced to */
    maxPoints: p.integer(),
    points: p.json<OverviewPoints>(),
    segments: p.json<OverviewSegment[]>(),
  },
});
