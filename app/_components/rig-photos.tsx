'use client';

import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { ApiError } from './api';

/** Photos of a rig, with an upload button for those who may edit it. */
export function RigPhotos({ rigId, photos, canUpload }: { rigId: string; photos: { id: string; filename: string }[]; canUpload: boolean }) {
  const router = useRouter();
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  if (!photos.length && !canUpload) return null;
  return (
    <section className="mt-6" aria-labelledby="photos-h">
      <h2 id="photos-h" className="text-lg">Photos</h2>
      <ul className="mt-2 flex flex-wrap gap-3">
        {photos.map((p) => (
          <li key={p.id}>
            <a href={`/api/files/${p.id}`}>
              {/* eslint-disable-next-line @next/next/no-img-element */}
              <img src={`/api/files/${p.id}`} alt={p.filename} className="h-32 w-44 rounded-lg object-cover ring-1 ring-paper-line" loading="lazy" />
            </a>
          </li>
        ))}
      </ul>
      {canUpload ? (
        <label className="btn-quiet mt-3 cursor-pointer">
          {busy ? 'Uploading…' : 'Add a photo'}
          <input
            type="file"
            accept="image/jpeg,image/png,image/webp"
            className="sr-only"
            onChange={async (e) => {
              const f = e.target.files?.[0];
              if (!f) return;
              setBusy(true);
              setError(null);
              try {
                const res = await fetch(`/api/rigs/${rigId}/photos?filename=${encodeURIComponent(f.name)}`, { method: 'POST', headers: { 'Content-Type': f.type }, body: f });
                if (!res.ok) throw new ApiError(res.status, ((await res.json().catch(() => ({}))) as { message?: string }).message ?? 'Upload failed.');
                router.refresh();
              } catch (err) {
                setError(err instanceof ApiError ? err.message : 'The upload failed.');
              } finally {
                setBusy(false);
              }
            }}
          />
        </label>
      ) : null}
      {error ? <p role="alert" className="mt-2 text-sm text-danger-text">{error}</p> : null}
    </section>
  );
}
