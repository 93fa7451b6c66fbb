import Link from 'next/link';

export default function NotFound() {
  return (
    <main id="main" className="mx-auto max-w-page px-4 py-16">
      <div className="card max-w-xl p-6">
        <p className="num text-sm text-ember-700">404</p>
        <h1 className="mt-1 text-2xl">Nothing here</h1>
        <p className="mt-2 text-ink-soft">This page does not exist, or it belongs to a lab you are not a member of.</p>
        <Link className="btn-primary mt-4" href="/">
          Back to Emberline
        </Link>
      </div>
    </main>
  );
}
