import { defineEntity, p } from '@mikro-orm/core';
import { baseProperties } from './base';
import { Lab } from './lab';
import { Rig } from './rig';
import { SourceFile } from './source-file';
import { Study } from './study';
import { User } from './user';

export const TEST_SESSION_STATES = ['planned', 'running', 'closed'] as const;
export type TestSessionState = (typeof TEST_SESSION_STATES)[number];

/** What a session was planned from, SI (the plan's input as given, and where its prior came from). */
export interface TestSessionSettings {
  model: string;
  prior: { source: 'fit' | 'guess'; fitId?: string | null; values: Record<string, number>; covariance?: number[][]; df?: number };
  inletTempC: number;
  flowRangeM3PerS: [number, number];
  maxOutletTempC: number;
  trials: number;
  seed: number;
  measurementUK: number;
  /** the segmentation preset of the logger's steady-state test */
  preset: 'laboratory' | 'collector' | 'field';
}

/** One run of a session as it goes: planned, repeated or added, done or skipped, with its trials. */
export interface TestSessionRun {
  /** stable within the session ("r1", "r9") */
  key: string;
  order: number;
  flowM3PerS: number;
  predictedOutletTempC: number;
  piLowC: number;
  piHighC: number;
  /** ∂(outlet)/∂(inlet) at this flow, for moving the prediction to the inlet read */
  inletSlope: number;
  purpose: 'design' | 'replicate' | 'reference' | 'added';
  state: 'pending' | 'done' | 'skipped';
  trialIds: string[];
}

/**
 * A test session at a rig: the plan (from a prior, a flow range, an outlet limit and a number of
 * trials), its runs as they are done, skipped, repeated or added, and the readings — trials of the
 * rig that point back here, and the logger's samples as a sensor log (`sourceFile`, the samples in
 * `sensor_sample` like any imported log). Closing stores the verdict (`closing`).
 */
export const TestSession = defineEntity({
  name: 'TestSession',
  tableName: 'test_session',
  indexes: [{ properties: ['rig', 'createdAt'] }],
  properties: {
    ...baseProperties(),
    lab: () => p.manyToOne(Lab).deleteRule('cascade'),
    rig: () => p.manyToOne(Rig).deleteRule('cascade'),
    createdBy: () => p.manyToOne(User).nullable().deleteRule('set null'),
    title: p.string().length(160),
    state: p.enum(() => [...TEST_SESSION_STATES]).default('planned').$type<TestSessionState>(),
    settings: p.json<TestSessionSettings>(),
    /** the plan as computed (analysis/plan planSession), SI */
    plan: p.json<Record<string, unknown>>(),
    runs: p.json<TestSessionRun[]>(),
    /** the logger's samples: a source file of the rig whose samples live in sensor_sample */
    sourceFile: () => p.manyToOne(SourceFile).nullable().deleteRule('set null'),
    /** time of the first and the latest stored sample (the log's time zero and its end) */
    firstSampleAt: p.datetime().columnType('timestamptz').nullable(),
    lastSampleAt: p.datetime().columnType('timestamptz').nullable(),
    sampleCount: p.integer().default(0),
    /** end of the last steady period made into a trial, s from the first sample */
    recordedUntilS: p.double().runtimeType('number').$type<number>().nullable(),
    closedAt: p.datetime().columnType('timestamptz').nullable(),
    closing: p.json<Record<string, unknown>>().nullable(),
    study: () => p.manyToOne(Study).nullable().deleteRule('set null'),
  },
});
