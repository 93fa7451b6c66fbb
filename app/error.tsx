'use client';

import { useEffect } from 'react';

export default function ErrorPage({ error, reset }: { error: Error & { digest?: string }; reset: () => void }) {
  useEffect(() => {
    console.error(error);
  }, [error]);
  return (
    <main id="main" className="mx-auto max-w-page px-4 py-16">
      <div className="card max-w-xl border-danger-line p-6">
        <h1 className="text-2xl">Something went wrong</h1>
        <p className="mt-2 text-ink-soft">
          The page could not be shown. Nothing you saved was changed. {error.digest ? <span className="num text-sm">Reference {error.digest}</span> : null}
        </p>
        <button type="button" className="btn-primary mt-4" onClick={reset}>
          Try again
        </button>
      </div>
    </main>
  );
}
