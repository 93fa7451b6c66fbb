import Link from 'next/link';
import type { ReactNode } from 'react';
import { AppPage } from '../../_components/app-page';
import { ReviewPanel } from '../../_components/review-panel';
import { reviewTrail } from '../../_lib/review/review';
import type { SavedFitRow } from '../../_lib/fits/collector-analysis';
import type { Viewer } from '../../_lib/accounts/viewer';

/**
 * The frame of a saved fit's page, coil or collector: the title with its version, who saved it
 * from which trials, the XLSX and per-table CSV exports, a refit link, the report (`children`:
 * figures and tables) and the review panel beside it.
 */
export async function SavedFitFrame({ viewer: v, row, modelLabel, csvTables, refitHref, children }: {
  viewer: Viewer;
  row: SavedFitRow;
  modelLabel: string;
  /** the sheets of the workbook offered one by one as CSV */
  csvTables: string[];
  refitHref: string;
  children: ReactNode;
}) {
  const trail = await reviewTrail(v.em, 'fit', row.id);
  const rig = row.rig;
  return (
    <AppPage
      viewer={v}
      title={`${row.title} · v${row.version}`}
      lead={
        <>
          {modelLabel} on <Link href={`/rigs/${rig.id}`}>{rig.name}</Link>, {row.trialIds.length} trials, saved {row.createdAt.toISOString().slice(0, 16).replace('T', ' ')} UTC by{' '}
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
            {csvTables.map((t) => (
              <a key={t} href={`/api/fits/${row.id}/export?format=csv&table=${t}`}>
                {t}
              </a>
            ))}
          </span>
          <Link className="btn-quiet" href={refitHref}>
            Refit
          </Link>
        </>
      }
    >
      <div className="grid gap-6 xl:grid-cols-[1fr_20rem]">
        <div className="min-w-0 space-y-6">{children}</div>
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
