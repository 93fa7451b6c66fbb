export default function Loading() {
  return (
    <div className="mx-auto max-w-page px-4 py-16" aria-busy="true">
      <div role="status" className="flex items-center gap-3 text-ink-soft">
        <span className="h-3 w-3 animate-pulse rounded-full bg-ember-500" aria-hidden="true" />
        Loading…
      </div>
    </div>
  );
}
