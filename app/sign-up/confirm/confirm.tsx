'use client';

import { PostButton } from '../../_components/post-button';

export function ConfirmSignUp({ token }: { token: string }) {
  return (
    <PostButton url="/api/auth/sign-up/confirm" body={{ token }} then="/rigs">
      Create my account
    </PostButton>
  );
}
