import 'server-only';
import type { EntityManager } from '@mikro-orm/postgresql';
import { SensorOverview, type LabRow, type SensorOverviewRow, type SourceFileRow } from '@/entities';
import { SEGMENT_ROWS, type BlockBody } from '@/app/_contracts/study-blocks';
import type { UnitSystem } from '@/analysis/units/unit-system';
import { runAnalysis } from '../server/analysis-pool';
import { pgPool } from '../server/pg-pool';
import { ensureSensorOverview } from '../imports/sensor-overview';
import { blockCacheKey, cachedBlockData } from '../server/block-cache';

/** A sensor log as the sensor-log block and the rig page show it. */
export type SensorLogBody = Extract<BlockBody, { type: 'sensor-log' }>;

/**
 * The view of one imported sensor log of `lab` from its stored overview (built once from the
 * samples for a log imported before overviews existed): its plots in the reader's units — the
 * temperatures with the air, the flow, and a collector log's irradiance, steady segments shaded —
 * kept in the block cache, and its segments. Null when the file holds no logged samples.
 * The caller has authorized the file (it belongs to `lab`).
 * @param publicView the share view: no file name
 */
export async function sensorLogBody(em: EntityManager, lab: LabRow, file: SourceFileRow, units: UnitSystem, publicView: boolean): Promise<SensorLogBody | null> {
  let overview = await em.findOne(SensorOverview, { sourceFile: file.id }, { populate: ['rig'] });
  if (!overview && (await ensureSensorOverview(pgPool(), file.id))) overview = await em.findOne(SensorOverview, { sourceFile: file.id }, { populate: ['rig'] });
  if (!overview) return null;
  return overviewBody(em, lab, file, overview, units, publicView);
}

/** The view of a log from its overview (loaded with its rig). */
async function overviewBody(em: EntityManager, lab: LabRow, file: SourceFileRow, overview: SensorOverviewRow, units: UnitSystem, publicView: boolean): Promise<SensorLogBody> {
  // the overview is written once per log (and rebuilt only with a new id or time): its plots are kept under both
  const key = blockCacheKey(['sensor-log-plots', overview.id, overview.updatedAt.getTime(), units]);
  const plots = await cachedBlockData(em, key, { labId: lab.id }, () =>
    runAnalysis('sensorLogFigures', { points: overview.points, segments: overview.segments.map((s) => ({ startS: s.startS, endS: s.endS })), origin: overview.startedAt, samples: overview.samples, units }));
  return {
    type: 'sensor-log',
    rigName: overview.rig.name,
    filename: publicView ? null : file.filename,
    startedAt: overview.startedAt.toISOString(),
    samples: overview.samples,
    shownPoints: overview.points.tS.length,
    durationS: overview.durationS,
    segments: overview.segments.slice(0, SEGMENT_ROWS),
    segmentCount: overview.segments.length,
    plots,
  };
}

/** Logs a rig page shows at most (the newest first); older ones stay in its list of files and in study blocks. */
export const RIG_LOGS_SHOWN = 2;

/**
 * The newest imported sensor logs of a rig, as the rig page shows them (at most RIG_LOGS_SHOWN):
 * the rig was loaded with loadInLab, and its files are its lab's. Trial sheets and test
 * sessions' samples are not logs here (a session's page shows its own).
 */
export async function rigSensorLogs(em: EntityManager, rig: { id: string; lab: LabRow }, units: UnitSystem): Promise<SensorLogBody[]> {
  // the logs are the files with an overview: one query for them, not a lookup (and a try at
  // building an overview from samples) for each of the rig's trial sheets on every view of the page
  const overviews = await em.find(
    SensorOverview,
    { rig: rig.id, sourceFile: { lab: rig.lab, purpose: 'trials', state: 'imported', $not: { storageKey: { $like: 'session:%' } } } },
    { populate: ['sourceFile', 'rig'], orderBy: { sourceFile: { createdAt: 'desc' } }, limit: RIG_LOGS_SHOWN },
  );
  const out: SensorLogBody[] = [];
  for (const o of overviews) out.push(await overviewBody(em, rig.lab, o.sourceFile, o, units, false));
  return out;
}
