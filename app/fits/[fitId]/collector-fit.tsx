import { CollectorReport } from '../../_components/collector-report';
import { collectorModelLabel, savedCollectorView, type SavedFitRow } from '../../_lib/fits/collector-analysis';
import type { Viewer } from '../../_lib/accounts/viewer';
import { SavedFitFrame } from './saved-fit-frame';

/** The page of a saved collector fit: the stored test, its exports and its review. */
export function SavedCollectorFit({ viewer, row }: { viewer: Viewer; row: SavedFitRow }) {
  return (
    <SavedFitFrame viewer={viewer} row={row} modelLabel={collectorModelLabel(row.model)} csvTables={['Summary', 'Collector']} refitHref={`/rigs/${row.rig.id}/collector`}>
      <CollectorReport view={savedCollectorView(row)} />
    </SavedFitFrame>
  );
}
