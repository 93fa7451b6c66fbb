'use client';

import { useStudy } from '../../_components/use-study';

/** Revision and last save of the study; follows the editor's saves through the shared SWR entry. */
export function StudyLead({ studyId }: { studyId: string }) {
  const s = useStudy(studyId).data?.study;
  if (!s) return null;
  return (
    <>
      Revision {s.revision}, last saved {s.updatedAt.slice(0, 16).replace('T', ' ')} UTC by {s.updatedBy ?? 'a former member'}.
    </>
  );
}
