/**
 * The shapes of the records that cross to the browser (JSON of the API and the props of client
 * components). The server builds them from entities in app/_lib (server/dto.ts, rigs/trials.ts),
 * listing each field, so a hidden column cannot slip out; clients and pages type their data with
 * these. Types only: no entities, no React, no 'server-only'.
 */
import type { UnitSystem } from '@/analysis/units/unit-system';
import type { RigDetails } from '@/analysis/performance/rig-details';

export interface UserDto {
  id: string;
  email: string;
  name: string;
  unitSystem: UnitSystem;
}

export interface LabDto {
  id: string;
  name: string;
  slug: string;
  unitSystem: UnitSystem;
  isDemo: boolean;
}

/** An API token as listed (never its secret, never its hash). */
export interface TokenDto {
  id: string;
  name: string;
  prefix: string;
  labId: string;
  createdAt: string;
  lastUsedAt: string | null;
  expiresAt: string;
  revokedAt: string | null;
}

/** A rig's construction details (SI), as stored: the one shape of analysis/performance/rig-details.ts. */
export type RigDetailsDto = RigDetails;

export interface RigDto {
  id: string;
  labId: string;
  name: string;
  heatSource: string;
  description: string;
  details: RigDetailsDto;
  notes: string;
  createdAt: string;
  updatedAt: string;
}

/** A trial: SI, temperatures in °C, with the warnings of the trial rule. */
export interface TrialDto {
  id: string;
  rigId: string;
  startedAt: string;
  bucketVolumeM3: number | null;
  fillTimesS: number[] | null;
  flowM3PerS: number;
  inletTempC: number;
  outletTempC: number;
  ambientTempC: number | null;
  /** irradiance in the collector plane, W/m² (solar-collector trials) */
  irradianceWPerM2: number | null;
  /** wind over the collector, m/s */
  windMPerS: number | null;
  isReference: boolean;
  excluded: boolean;
  notes: string;
  origin: string;
  sourceFileId: string | null;
  sourceLine: number | null;
  warnings: string[];
}

/** One page of a rig's trials, with the hottest inlet and outlet (°C) of all trials matching the query. */
export interface TrialPageDto {
  trials: TrialDto[];
  total: number;
  page: number;
  pageSize: number;
  hottest?: { inletTempC: number | null; outletTempC: number | null };
}

/** A background job as the browser sees it (built by `app/_lib/jobs/job-dto.ts`). */
export interface ImportJobDto {
  id: string;
  kind: 'sensor-import';
  state: 'queued' | 'running' | 'completed' | 'failed' | 'cancelled';
  rigId: string;
  fileId: string;
  filename: string | null;
  progress: { bytesDone: number; bytesTotal: number; rowsDone: number; fraction: number };
  attempts: number;
  cancelRequested: boolean;
  result: { samples?: number; trials?: number; excludedRows?: number; skippedRows?: number; notices?: string[] } | null;
  error: string | null;
  createdAt: string;
  startedAt: string | null;
  finishedAt: string | null;
}
