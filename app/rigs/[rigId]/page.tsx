import Link from 'next/link';
import { AppPage } from '../../_components/app-page';
import { RigForm } from '../../_components/rig-form';
import { RigPhotos } from '../../_components/rig-photos';
import { HEAT_SOURCE_LABELS } from '../../_lib/rigs/labels';
import { TrialsTable } from '../../_components/trials-table';
import { RigJobs } from '../../_components/job-progress';
import { importJobDto } from '../../_lib/jobs/job-dto';
import { listRigJobs } from '../../_lib/jobs/job-store';
import { rigDto } from '../../_lib/server/dto';
import { rigFiles } from '../../_lib/rigs/rigs';
import { loadInLab } from '../../_lib/labs/load-in-lab';
import { requireLabAction } from '../../_lib/accounts/viewer';
import { SessionPlanner } from './session-plan';
import { OperatingPlans } from './operating-plans';
import { planDto, plansOfRig } from '../../_lib/rigs/operating-plans';
import { rigSessionsPanel } from '../../_lib/sessions/sessions';
import { rigSensorLogs } from '../../_lib/studies/sensor-log-body';
import { SensorLogView } from '../../_components/sensor-log-view';

export const dynamic = 'force-dynamic';

export default async function RigPage({ params, searchParams }: { params: Promise<{ rigId: string }>; searchParams: Promise<{ edit?: string }> }) {
  const { rigId } = await params;
  const { edit } = await searchParams;
  const v = await requireLabAction(`/rigs/${rigId}`, 'lab:read');
  const { row: rig } = await loadInLab(v, 'rig', rigId, 'lab:read');
  const { files, photos } = await rigFiles(v.em, rig);
  const jobs = (await listRigJobs(v.em, rig)).map(importJobDto);
  const write = v.can('trial:write');
  const sessions = await rigSessionsPanel(v.em, rig);
  const plans = (await plansOfRig(v.em, rig)).map(planDto);
  const logs = await rigSensorLogs(v.em, rig, v.user.unitSystem);
  const d = rig.details ?? {};
  const facts = [
    d.coilLengthM ? `${d.coilLengthM} m of tube` : null,
    d.tubeInnerDiameterM ? `${(Number(d.tubeInnerDiameterM) * 1000).toFixed(1)} mm bore` : null,
    d.tubeMaterial ? String(d.tubeMaterial) : null,
    d.collectorAreaM2 ? `${d.collectorAreaM2} m² collector` : null,
    d.grossAreaM2 ? `${d.grossAreaM2} m² gross` : null,
    d.apertureAreaM2 ? `${d.apertureAreaM2} m² aperture` : null,
    d.tiltDeg !== undefined ? `tilt ${d.tiltDeg}°` : null,
    d.azimuthDeg !== undefined ? `azimuth ${d.azimuthDeg}°` : null,
    d.fluid ? String(d.fluid) : null,
    d.burnerRatingW ? `${Number(d.burnerRatingW) / 1000} kW burner` : null,
    d.buildCost ? `built for ${Number(d.buildCost)} ${String(d.buildCostCurrency ?? 'USD')}` : null,
  ].filter(Boolean);
  return (
    <AppPage
      viewer={v}
      title={rig.name}
      lead={
        <>
          <span className="mr-2 rounded-full bg-ember-50 px-2.5 py-0.5 text-xs font-semibold text-ember-700 ring-1 ring-ember-100">{HEAT_SOURCE_LABELS[rig.heatSource]}</span>
          {rig.description}
          {facts.length ? <span className="mt-1 block text-sm text-ink-muted">{facts.join(' · ')}</span> : null}
        </>
      }
      actions={
        <>
          {rig.heatSource === 'solar-collector' ? (
            <Link className={write ? 'btn-quiet' : 'btn-primary'} href={`/rigs/${rig.id}/collector`}>
              Collector efficiency
            </Link>
          ) : (
            <Link className={write ? 'btn-quiet' : 'btn-primary'} href={`/rigs/${rig.id}/fit`}>
              Fit models
            </Link>
          )}
          {write ? (
          <>
            <Link className="btn-primary" href={`/rigs/${rig.id}/entry`}>
              Add a trial
            </Link>
            <Link className="btn-quiet" href={`/rigs/${rig.id}/import`}>
              Import a file
            </Link>
            {v.can('rig:write') ? (
              <Link className="btn-quiet" href={`/rigs/${rig.id}?edit=1`}>
                Edit rig
              </Link>
            ) : null}
          </>
          ) : null}
        </>
      }
    >
      {edit && v.can('rig:write') ? (
        <section className="card mb-6 max-w-2xl p-6" aria-label="Edit rig">
          <RigForm labId={v.current.lab.id} rig={rigDto(rig) as Parameters<typeof RigForm>[0]['rig']} />
        </section>
      ) : null}
      <RigJobs rigId={rig.id} initial={jobs} canCancel={write} />
      <TrialsTable rigId={rig.id} units={v.user.unitSystem} canWrite={write} />
      {logs.length ? (
        <section className="card mt-6 p-5" aria-labelledby="rig-logs">
          <h2 id="rig-logs" className="text-lg">Logged data</h2>
          <p className="mt-1 text-sm text-ink-muted">
            The steady periods found in {logs.length === 1 ? 'the log' : 'each log'} are shaded and numbered; each became one of the trials above.
            {rig.heatSource === 'solar-collector' ? <> Their efficiency curve is on <Link href={`/rigs/${rig.id}/collector`}>Collector efficiency</Link>.</> : null}
          </p>
          <div className="mt-4 space-y-8">
            {logs.map((log, i) => (
              <SensorLogView key={i} log={log} units={v.user.unitSystem} />
            ))}
          </div>
        </section>
      ) : null}
      <SessionPlanner rigId={rig.id} units={v.user.unitSystem} sessions={sessions.sessions} fits={sessions.fits} canWrite={write} />
      <OperatingPlans rigId={rig.id} units={v.user.unitSystem} initial={plans} canWrite={v.can('rig:write')} />
      {rig.notes ? (
        <section className="card mt-6 p-5">
          <h2 className="text-lg">Notes</h2>
          <p className="mt-2 whitespace-pre-wrap text-ink-soft">{rig.notes}</p>
        </section>
      ) : null}
      <RigPhotos rigId={rig.id} photos={photos.map((p) => ({ id: p.id, filename: p.filename }))} canUpload={v.can('rig:write')} />
      {files.length ? (
        <section className="mt-6">
          <h2 className="text-lg">Imported files</h2>
          <ul className="mt-2 space-y-1 text-sm">
            {files.map((f) => (
              <li key={f.id} className="flex flex-wrap gap-x-3">
                <a href={`/api/files/${f.id}`}>{f.filename}</a>
                <span className="num text-ink-muted">{f.sha256.slice(0, 12)}…</span>
                <span className="text-ink-muted">{f.state}, {f.rowsImported} rows</span>
              </li>
            ))}
          </ul>
        </section>
      ) : null}
    </AppPage>
  );
}
