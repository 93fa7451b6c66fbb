/**
 * Every entity, listed explicitly: folder globs do not survive bundling. The `sensor_sample`
 * table is not an entity: it is written by COPY and read by SQL only (app/_lib/imports/copy-writer.ts,
 * migrations `trial_import`, `sensor_sample_storage` and `sensor_sample_brin`).
 */
import { ApiToken } from './api-token';
import { AuditEvent } from './audit-event';
import { Invitation } from './invitation';
import { Lab } from './lab';
import { Membership } from './membership';
import { PasswordReset } from './password-reset';
import { RateLimit } from './rate-limit';
import { Rig } from './rig';
import { Session } from './session';
import { Trial } from './trial';
import { SourceFile } from './source-file';
import { ColumnMapping } from './column-mapping';
import { TrialChange } from './trial-change';
import { Fit } from './fit';
import { Study } from './study';
import { Comment } from './comment';
import { ReviewEvent } from './review-event';
import { Notice } from './notice';
import { ShareLink } from './share-link';
import { User } from './user';
import { ImportJob } from './import-job';
import { SensorOverview } from './sensor-overview';
import { BlockCache } from './block-cache';
import { PendingSignUp } from './pending-sign-up';
import { TestSession } from './test-session';
import { Comparison } from './comparison';
import { OperatingPlan } from './operating-plan';

export { Comment, Fit, Notice, ReviewEvent, ShareLink, Study, ColumnMapping, SourceFile, TrialChange, ApiToken, AuditEvent, Invitation, Lab, Membership, PasswordReset, RateLimit, Rig, Session, Trial, User, ImportJob, SensorOverview, PendingSignUp, TestSession, Comparison, BlockCache, OperatingPlan };
export const entities = [Lab, User, Membership, Rig, Trial, Session, Invitation, PasswordReset, ApiToken, AuditEvent, RateLimit, SourceFile, ColumnMapping, TrialChange, Fit, Study, Comment, ReviewEvent, Notice, ShareLink, ImportJob, SensorOverview, PendingSignUp, TestSession, Comparison, BlockCache, OperatingPlan];

import type { InferEntity } from '@mikro-orm/core';
/** Row types of the entities, for code that handles loaded records. */
export type LabRow = InferEntity<typeof Lab>;
export type UserRow = InferEntity<typeof User>;
export type MembershipRow = InferEntity<typeof Membership>;
export type RigRow = InferEntity<typeof Rig>;
export type TrialRow = InferEntity<typeof Trial>;
export type SessionRow = InferEntity<typeof Session>;
export type InvitationRow = InferEntity<typeof Invitation>;
export type PasswordResetRow = InferEntity<typeof PasswordReset>;
export type ApiTokenRow = InferEntity<typeof ApiToken>;
export type AuditEventRow = InferEntity<typeof AuditEvent>;
export type SourceFileRow = InferEntity<typeof SourceFile>;
export type ColumnMappingRow = InferEntity<typeof ColumnMapping>;
export type TrialChangeRow = InferEntity<typeof TrialChange>;
export type FitRow = InferEntity<typeof Fit>;
export type StudyRow = InferEntity<typeof Study>;
export type CommentRow = InferEntity<typeof Comment>;
export type ReviewEventRow = InferEntity<typeof ReviewEvent>;
export type NoticeRow = InferEntity<typeof Notice>;
export type ShareLinkRow = InferEntity<typeof ShareLink>;
export type ImportJobRow = InferEntity<typeof ImportJob>;
export type SensorOverviewRow = InferEntity<typeof SensorOverview>;
export type BlockCacheRow = InferEntity<typeof BlockCache>;
export type PendingSignUpRow = InferEntity<typeof PendingSignUp>;
export type TestSessionRow = InferEntity<typeof TestSession>;
export type ComparisonRow = InferEntity<typeof Comparison>;
export type OperatingPlanRow = InferEntity<typeof OperatingPlan>;
