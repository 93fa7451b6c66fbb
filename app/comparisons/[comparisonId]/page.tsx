import Link from 'next/link';
import { AppPage } from '../../_components/app-page';
import { DesignComparison } from '../../_components/design-comparison';
import { ReviewPanel } from '../../_components/review-panel';
import { requireLabAction } from '../../_lib/accounts/viewer';
import { readComparison } from '../../_lib/comparisons/comparisons';
import { loadInLab } from '../../_lib/labs/load-in-lab';
import { reviewTrail } from '../../_lib/review/review';
import { DomainError } from '../../_lib/server/errors';

export const metadata = { title: 'Design comparison' };
export const dynamic = 'force-dynamic';

export default async function ComparisonPage({ params }: { params: Promise<{ comparisonId: string }> }) {
  const { comparisonId } = await params;
  const v = await requireLabAction(`/comparisons/${comparisonId}`, 'lab:read');
  const { row } = await loadInLab(v, 'comparison', comparisonId, 'lab:read');
  const units = v.user.unitSystem;
  let view = null;
  let problem: string | null = null;
  try {
    view = await readComparison(v.em, row, units);
  } catch (e) {
    if (!(e instanceof DomainError && e.kind === 'invalid')) throw e;
    problem = e.message;
  }
  const trail = await reviewTrail(v.em, 'comparison', row.id);
  return (
    <AppPage
      viewer={v}
      title={row.title}
      lead={
        <>
          {row.subjects.length} designs, saved {row.createdAt.toISOString().slice(0, 16).replace('T', ' ')} UTC by {row.createdBy?.name ?? 'a former member'}. Recomputed from the trials each time it is
          opened. <Link href="/comparisons">All comparisons</Link>
        </>
      }
      actions={
        view ? (
          <>
            <a className="btn-quiet" href={`/api/comparisons/${row.id}/export`}>
              Download XLSX
            </a>
            <a className="btn-quiet" href={`/api/comparisons/${row.id}/export?format=csv&table=Comparison`}>
              CSV
            </a>
          </>
        ) : null
      }
    >
      <div className="grid gap-6 xl:grid-cols-[1fr_20rem]">
        <div className="min-w-0">
          {view ? (
            <DesignComparison view={view} units={units} filename="comparison" />
          ) : (
            <p role="alert" className="card border-danger-line p-4 text-danger-text">
              This comparison cannot be computed now: {problem}
            </p>
          )}
        </div>
        <ReviewPanel kind="comparison" id={row.id} state="draft" canSubmit={false} canDecide={false} canComment={v.can('review:comment')} comments={trail.comments} events={trail.events} />
      </div>
    </AppPage>
  );
}
