import { loadInLab } from '@/app/_lib/labs/load-in-lab';
import { exportResponse } from '@/app/_lib/studies/study-export';
import { parseStoredFit } from '@/app/_lib/fits/stored-fit';
import { modelLabel } from '@/app/_lib/fits/fit-analysis';
import { collectorFitExport } from '@/app/_lib/fits/collector-analysis';
import { route } from '@/app/_lib/server/route';


/** GET: the saved fit as XLSX (Summary, Trials, Fit, Residuals, Performance) in the user's units, or one table as CSV (`?format=csv&table=Fit`). */
export const GET = route<{ fitId: string }>({ auth: 'user' }, async (ctx) => {
  const { row: fit, member } = await loadInLab(ctx, 'fit', ctx.params.fitId, 'lab:export');
  if (fit.kind === 'collector') return exportResponse(collectorFitExport(fit, member.lab.name, ctx.requireActor().user.unitSystem), `${fit.title}-v${fit.version}`, ctx.req.nextUrl.searchParams);
  const rig = fit.rig;
  const r = parseStoredFit(fit.result, fit.id);
  const label = modelLabel(fit.model);
  const data = {
    unitSystem: ctx.requireActor().user.unitSystem,
    provenance: {
      lab: member.lab.name,
      rig: rig.name,
      fitId: fit.id,
      fitVersion: fit.version,
      model: label,
      fitTime: fit.createdAt,
      softwareVersion: fit.softwareVersion,
      dataHash: fit.trialsHash,
    },
    trials: r.trials.map((t, i) => ({
      id: t.id,
      order: i + 1,
      timestamp: new Date(t.startedAt),
      included: true,
      flowM3PerS: t.flowM3PerS,
      inletTempC: t.inletTempC,
      outletTempC: t.outletTempC,
      ambientTempC: t.ambientTempC,
      bucketVolumeM3: t.bucketVolumeM3,
      fillTimesS: t.fillTimesS,
      notes: t.notes,
    })),
    fits: [{ label, fit: r.fit, pointIds: r.trials.map((t) => t.id) }],
    performance: [{ label, table: r.performance }],
    notes: [`Review state: ${fit.reviewState}.`],
  };
  return exportResponse(data, `${fit.title}-v${fit.version}`, ctx.req.nextUrl.searchParams, ctx.req);
});
