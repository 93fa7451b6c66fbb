/** Segmentation of logged sensor data into steady trials (DOMAIN.md §2.4, §2.6). */
export { PRESETS, resolveCriteria, type PresetName, type SteadyCriteria } from './steady-criteria';
export { segmentLog, segmentLogSteps, type SteadySegment, type RejectedRun, type Gap, type SegmentationResult } from './segment-log';
export { segmentStats, blockMeans, type ChannelValues, type SegmentStats, type LogChannels } from './segment-stats';
export { generatePlateauLog, type PlateauSpec, type GeneratedLog } from './synthetic-log';
