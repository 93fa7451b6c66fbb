import Link from 'next/link';
import { AppPage } from '../../_components/app-page';
import { CollectorReport } from '../../_components/collector-report';
import { ReviewPanel } from '../../_components/review-panel';
import { collectorModelLabel, savedCollectorView, type SavedFitRow } from '../../_lib/fits/collector-analysis';
import { reviewTrail } from '../../_lib/review/review';
import type { Viewer } from '../../_lib/accounts/viewer';

/** The page of a saved collector fit: the stored test, its exports and its review. */
export async function SavedCollectorFit({ viewer: v, row }: { viewer: Viewer; row: SavedFitRow }) {
  const view = savedCollectorView(row);
  const trail = await reviewTrail(v.em, 'fit', row.id);
  const rig = row.rig;
  return (
    <AppPage
      viewer={v}
      title={`${row.title} · v${row.version}`}
      lead={
        <>
          {collectorModelLabel(row.model)} on <Link href={`/rigs/${rig.id}`}>{rig.name}</Link>, {row.trialIds.length} trials, saved {row.createdAt.toISOString().slice(0, 16).replace('T', ' ')} UTC by{' '}
          {row.createdBy?.name ?? 'a former member'}. <span className="num text-xs">{row.softwareVersion} · trials {row.trialsHash.slice(0, 12)}</span>
        </>
      }
      actions={
        <>
          <a className="btn-quiet" href={`/api/fits/${row.id}/export`}>
            Download XLSX
          </a>
          <span className="flex items-center gap-2 text-sm">
            CSV:
            {['Summary', 'Collector'].map((t) => (
              <a key={t} href={`/api/fits/${row.id}/export?format=csv&table=${t}`}>
                {t}
              </a>
            ))}
          </span>
          <Link className="btn-quiet" href={`/rigs/${rig.id}/collector`}>
            Refit
          </Link>
        </>
      }
    >
      <div className="grid gap-6 xl:grid-cols-[1fr_20rem]">
        <div className="min-w-0">
          <CollectorReport view={view} />
        </div>
        <ReviewPanel
          kind="fit"
          id={row.id}
          state={row.reviewState}
          canSubmit={v.can('fit:write')}
          canDecide={v.can('review:decide')}
          ownWork={row.createdBy?.id === v.user.id}
          canComment={v.can('review:comment')}
          comments={trail.comments}
          events={trail.events}
        />
      </div>
    </AppPage>
  );
}
