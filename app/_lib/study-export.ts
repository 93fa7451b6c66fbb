import 'server-only';
import type { EntityManager } from '@mikro-orm/postgresql';
import { Fit, Rig, type StudyRow } from '@/entities';
import type { FitSuccess } from '@/analysis/fit';
import type { PerformanceTable } from '@/analysis/performance/performance-table';
import { studyWorkbook, type FitExport, type PerformanceExport, type TrialExportRow } from './export';
import { modelLabel, SOFTWARE_VERSION } from './fit-analysis';

interface StoredTrial {
  id: string;
  startedAt: string;
  flowM3PerS: number;
  inletC: number;
  outletC: number;
  bucketVolumeM3: number | null;
  fillTimesS: number[] | null;
  ambientC: number | null;
}

/** The saved fits a study's blocks point at, in block order, once each (lab-scoped). */
export async function studyFits(em: EntityManager, study: StudyRow) {
  const ids = [...new Set(study.blocks.map((b) => b.data.fitId).filter((x): x is string => typeof x === 'string'))];
  const rows = ids.length ? await em.find(Fit, { id: { $in: ids }, lab: study.lab }) : [];
  return ids.map((id) => rows.find((r) => r.id === id)).filter((r): r is NonNullable<typeof r> => !!r);
}

/** The study as an XLSX workbook: Summary (provenance), Trials, Fit, Residuals, Performance. */
export async function studyXlsx(em: EntityManager, study: StudyRow, labName: string, unitSystem: 'si' | 'us'): Promise<Buffer> {
  const fits = await studyFits(em, study);
  const rigs = fits.length ? await em.find(Rig, { id: { $in: fits.map((f) => f.rig.id) } }) : [];
  const trials: TrialExportRow[] = [];
  const fitExports: FitExport[] = [];
  const performance: PerformanceExport[] = [];
  for (const f of fits) {
    const r = f.result as { fit: FitSuccess; performance: PerformanceTable; trials: StoredTrial[] };
    const label = `${f.title} v${f.version} (${modelLabel(f.model)})`;
    r.trials.forEach((t, i) =>
      trials.push({ id: t.id, order: i + 1, timestamp: new Date(t.startedAt), included: true, flowM3PerS: t.flowM3PerS, inletTempC: t.inletC, outletTempC: t.outletC, ambientTempC: t.ambientC, bucketVolumeM3: t.bucketVolumeM3, fillTimesS: t.fillTimesS }),
    );
    fitExports.push({ label, fit: r.fit, pointIds: r.trials.map((t) => t.id) });
    performance.push({ label, table: r.performance });
  }
  return studyWorkbook({
    unitSystem,
    provenance: {
      lab: labName,
      study: study.title,
      rig: rigs.map((r) => r.name).join(', ') || null,
      model: fits.map((f) => modelLabel(f.model)).join(', ') || null,
      fitTime: fits[0]?.createdAt ?? null,
      softwareVersion: SOFTWARE_VERSION,
      dataHash: fits.map((f) => f.trialsHash.slice(0, 16)).join(' ') || null,
    },
    trials,
    fits: fitExports,
    performance,
    notes: [`Study revision ${study.revision}, review state: ${study.reviewState}.`],
  });
}

export function xlsxResponse(buf: Buffer, title: string) {
  const name = `${title.replace(/[^\w.-]+/g, '-').slice(0, 60) || 'study'}.xlsx`;
  return new Response(new Uint8Array(buf), {
    headers: { 'Content-Type': 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet', 'Content-Disposition': `attachment; filename="${name}"` },
  });
}
