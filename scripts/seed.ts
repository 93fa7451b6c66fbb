/**
 * Loads the demo lab (fixtures/demo-lab.ts, an invented scenario: fixtures/README.md) once; a
 * second run changes nothing. In one transaction: the lab, its four members, the rigs with their
 * trials, saved fits in every review state (with the reviewer's comments and the review history),
 * a design comparison of the two coils, and a study in review (text, fit, comparison, forecast,
 * cost sheet with a season, tub fill and caution blocks) with a live share link. Then, on its own connection as the import
 * job does it, the sensor logs (the burner loop's, the solar collector's day) imported and
 * recorded as completed jobs. The
 * numbers come from the app's own functions (saveFit, importSensorLog), never written by hand.
 *
 * Runs under `--conditions=react-server` (scripts/lib/bootstrap.mjs), so that app/_lib loads.
 */
import { createHash, randomUUID } from 'node:crypto';
import { Readable } from 'node:stream';
import type { EntityManager } from '@mikro-orm/postgresql';
import { hash } from '@node-rs/argon2';
import { Comment, Comparison, Lab, Membership, ReviewEvent, Rig, SourceFile, Study, Trial, User, type FitRow, type LabRow, type UserRow } from '../entities';
import type { StudyBlock } from '../entities/study';
import { DEMO_LOG_MAPPING, DEMO_PASSWORD, demoLab, demoSensorLogCsv, demoUsers, demoWork, generateTrials, rigPlans } from '../fixtures/demo-lab';
import { ARGON2_OPTIONS } from '../app/_lib/accounts/password-options';
import { saveFit, saveFitInput } from '../app/_lib/fits/fits';
import { createShare, studySave } from '../app/_lib/studies/studies';
import { importSensorLog, logImportInput } from '../app/_lib/imports/sensor-import';
import { claimImportJob, completeImportJob, createImportJob } from '../app/_lib/jobs/job-store';
import { pgPool } from '../app/_lib/server/pg-pool';
import { seedSolarDemo, solarDemoLog } from './seed-solar';
import { seedPlanDemo } from './seed-plan';

/** The people of the demo lab by role. */
export type DemoPeople = Record<(typeof demoUsers)[number]['role'], UserRow>;

/**
 * Seeds that other parts of the demo add to the lab inside the same transaction (the solar
 * collector rig adds its own here), each given the lab and its people.
 */
export const DEMO_EXTRA_SEEDS: ((tx: EntityManager, lab: LabRow, people: DemoPeople) => Promise<void>)[] = [
  async (tx, lab, people) => seedSolarDemo(tx, lab, people.engineer),
  async (tx, lab, people) => seedPlanDemo(tx, lab, people.engineer),
];

export async function seedDemoLab(em: EntityManager): Promise<boolean> {
  let seeded = false;
  if (!(await em.findOne(Lab, { slug: demoLab.slug }))) {
    await em.transactional(async (tx) => {
      const lab = tx.create(Lab, { ...demoLab, isDemo: true });
      const passwordHash = await hash(DEMO_PASSWORD, ARGON2_OPTIONS);
      const people = {} as DemoPeople;
      for (const u of demoUsers) {
        const user = (await tx.findOne(User, { email: u.email })) ?? tx.create(User, { email: u.email, name: u.name, passwordHash });
        tx.create(Membership, { user, lab, role: u.role });
        people[u.role] = user;
      }
      for (const plan of rigPlans) {
        const rig = tx.create(Rig, { lab, name: plan.name, heatSource: plan.heatSource, description: plan.description, details: plan.details });
        for (const t of generateTrials(plan)) tx.create(Trial, { lab, rig, origin: 'demo', ...t });
      }
      await tx.flush();
      await seedWork(tx as EntityManager, lab, people);
      for (const extra of DEMO_EXTRA_SEEDS) await extra(tx as EntityManager, lab, people);
    });
    seeded = true;
  }
  try {
    for (const log of DEMO_LOGS) await seedSensorLog(em.fork(), log);
  } finally {
    await pgPool().end();
  }
  return seeded;
}

/** A review step as the review module records it (no mail: nobody is signed in while the demo loads). */
function reviewStep(tx: EntityManager, lab: LabRow, actor: UserRow, kind: 'fit' | 'study', id: string, from: string, to: string, note = '') {
  tx.create(ReviewEvent, { lab, actor, targetKind: kind, targetId: id, fromState: from as never, toState: to as never, note });
}

async function seedWork(tx: EntityManager, lab: LabRow, p: DemoPeople) {
  const rigs = new Map((await tx.find(Rig, { lab })).map((r) => [r.name, r]));
  const fits = new Map<string, FitRow>();
  for (const f of demoWork.fits) {
    const rig = rigs.get(f.rig)!;
    const trials = await tx.find(Trial, { rig, excluded: false }, { orderBy: { startedAt: 'asc' } });
    const row = await saveFit(tx, rig, p.engineer, saveFitInput.parse({ title: f.title, model: f.model, compareWith: f.compareWith, trialIds: trials.map((t) => t.id) }));
    fits.set(f.title, row);
    if (f.state !== 'draft') reviewStep(tx, lab, p.engineer, 'fit', row.id, 'draft', 'in-review');
    if (f.comment) tx.create(Comment, { lab, author: p.reviewer, targetKind: 'fit', targetId: row.id, body: f.comment });
    if (f.state === 'approved' || f.state === 'changes-requested') reviewStep(tx, lab, p.reviewer, 'fit', row.id, 'in-review', f.state, f.state === 'approved' ? '' : 'See my comment.');
    row.reviewState = f.state;
  }
  await tx.flush();

  const c = demoWork.comparison;
  const comparison = tx.create(Comparison, { lab, createdBy: p.engineer, title: c.title, subjects: c.rigs.map((name) => ({ kind: 'rig' as const, id: rigs.get(name)!.id })), settings: { inletTempC: 18, flowM3PerS: 10 / 60_000 } });
  await tx.flush();
  tx.create(Comment, { lab, author: p.reviewer, targetKind: 'comparison', targetId: comparison.id, body: c.comment });

  const approved = fits.get(demoWork.fits[0].title)!;
  const id = () => randomUUID().slice(0, 8);
  const forecastId = id();
  const blocks: StudyBlock[] = studySave.parse({
    title: demoWork.study.title,
    baseRevision: 1,
    blocks: [
      { id: id(), kind: 'text', data: { markdown: `## ${demoWork.study.title}\n\nTwo coils on the same fire barrel: twelve metres (A) and eighteen metres (B) of the same copper tube. Does the longer coil heat the pool faster, and is it worth what it cost?` } },
      { id: id(), kind: 'fit', data: { fitId: approved.id } },
      { id: id(), kind: 'design-comparison', data: { comparisonId: comparison.id } },
      { id: forecastId, kind: 'forecast', data: { poolVolume: '40 m^3', startTemp: '20 degC', targetTemp: '28 degC', hours: 48, flow: '12 L/min', fitId: approved.id, losses: false } },
      {
        id: id(), kind: 'costs', data: {
          fuel: 'wood', price: 250, currency: 'USD', heatFrom: 'forecast', forecastBlockId: forecastId,
          // a summer season held at 28 °C under an invented mean day; the build cost is the rig's, the purchased heater illustrative
          season: {
            days: 120, hoursPerDay: 8, targetTemp: '28 degC', cover: true, surfaceArea: '32 m^2',
            weather: { airTemp: '24 degC', relativeHumidity: 0.6, wind: '2 m/s', solar: '150 W/m^2' },
            purchased: { price: 1800, fuel: 'propane', fuelPrice: 3.5, efficiency: 0.82 },
          },
        },
      },
      { id: id(), kind: 'tub-fill', data: { fitId: approved.id, tubVolume: '1200 L', flow: '6 L/min', supplyTemp: '15 degC', targetTemp: '38 degC' } },
      { id: id(), kind: 'caution', data: { text: 'Never close a valve on the coil while the fire burns: steam in a closed coil can burst it.' } },
    ],
  }).blocks as StudyBlock[];
  const study = tx.create(Study, { lab, createdBy: p.engineer, updatedBy: p.engineer, title: demoWork.study.title, blocks, reviewState: 'in-review', editedSinceReview: [p.engineer.id] });
  await tx.flush();
  reviewStep(tx, lab, p.engineer, 'study', study.id, 'draft', 'in-review');
  tx.create(Comment, { lab, author: p.reviewer, targetKind: 'study', targetId: study.id, blockId: forecastId, body: demoWork.study.comment });
  await createShare(tx, study, p.engineer, 365);
  await tx.flush();
}

/** A logger file of the demo: the rig it belongs to, its name, its bytes (from a fixture), its mapping and steadiness preset. */
interface DemoLog { rig: string; filename: string; csv: () => string; mapping: unknown; preset: 'laboratory' | 'collector' | 'field' }

/** The demo's logger files: the burner loop's (field preset) and the solar collector's day (collector preset). */
const DEMO_LOGS: DemoLog[] = [
  { rig: demoWork.log.rig, filename: demoWork.log.filename, csv: demoSensorLogCsv, mapping: DEMO_LOG_MAPPING, preset: 'field' },
  solarDemoLog,
];

/**
 * A logger file of the demo, imported as the background job imports an upload (job-store
 * records, importSensorLog writes); the raw bytes are generated again from the fixture, so they
 * are not put in object storage (which is not running while the database is set up). A file
 * already there is left as it is, so a second run changes nothing.
 */
async function seedSensorLog(em: EntityManager, log: DemoLog) {
  const lab = await em.findOne(Lab, { slug: demoLab.slug });
  if (!lab) return;
  const rig = await em.findOne(Rig, { lab, name: log.rig });
  if (!rig || (await em.findOne(SourceFile, { lab, filename: log.filename }))) return;
  const engineer = await em.findOne(User, { email: demoUsers.find((u) => u.role === 'engineer')!.email });
  const bytes = Buffer.from(log.csv());
  const file = em.create(SourceFile, {
    lab, rig, uploadedBy: engineer, filename: log.filename, contentType: 'text/csv', sizeBytes: bytes.length,
    sha256: createHash('sha256').update(bytes).digest('hex'), storageKey: `demo/${log.filename}`,
  });
  await em.flush();
  const input = logImportInput.parse({ mapping: log.mapping, preset: log.preset });
  const job = await createImportJob(em, rig, file, engineer, input);
  if (!(await claimImportJob(em, job.id))) return;
  const result = await importSensorLog(
    { fileId: file.id, rigId: rig.id, labId: lab.id, filename: file.filename, storageKey: file.storageKey, sizeBytes: bytes.length, uploadedAt: file.createdAt },
    input,
    { open: async () => Readable.from([bytes]) },
  );
  await completeImportJob(job.id, result);
}
