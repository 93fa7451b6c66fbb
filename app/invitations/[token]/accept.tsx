'use client';

import { PostButton } from '../../_components/post-button';

export function AcceptInvitation({ token }: { token: string }) {
  return (
    <PostButton url={`/api/invitations/${encodeURIComponent(token)}`} then="/rigs">
      Accept and join
    </PostButton>
  );
}
