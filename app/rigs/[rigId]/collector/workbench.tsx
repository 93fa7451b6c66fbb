'use client';

import { useRouter } from 'next/navigation';
import { useEffect, useState } from 'react';
import { api, ApiError } from '../../../_components/api';
import { CollectorReport } from '../../../_components/collector-report';
import type { CollectorViewDto } from '../../../_contracts/collector';

/** The collector test of a rig, live on its trials: area basis and order; save the result as a fit. */
export function CollectorWorkbench({ rigId, rigName, grossAreaM2, apertureAreaM2, canSave }: { rigId: string; rigName: string; grossAreaM2: number | null; apertureAreaM2: number | null; canSave: boolean }) {
  const router = useRouter();
  const [basis, setBasis] = useState<'gross' | 'aperture'>(grossAreaM2 !== null || apertureAreaM2 === null ? 'gross' : 'aperture');
  const [order, setOrder] = useState<1 | 2>(2);
  const [result, setResult] = useState<CollectorViewDto | null>(null);
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const [title, setTitle] = useState(`${rigName} — collector curve`);
  const [saveError, setSaveError] = useState<string | null>(null);

  useEffect(() => {
    let live = true;
    // the analysis is fetched here, so its busy flag is set here
    // eslint-disable-next-line react-hooks/set-state-in-effect
    setBusy(true);
    api<CollectorViewDto>(`/api/rigs/${rigId}/collector`, { body: { areaBasis: basis, order } })
      .then((r) => {
        if (!live) return;
        setResult(r);
        setError(null);
      })
      .catch((e) => {
        if (!live) return;
        setResult(null);
        setError(e instanceof ApiError ? e.message : 'The server could not be reached.');
      })
      .finally(() => live && setBusy(false));
    return () => {
      live = false;
    };
  }, [basis, order, rigId]);

  async function save() {
    setSaveError(null);
    try {
      const r = await api<{ fit: { id: string } }>(`/api/rigs/${rigId}/collector/fits`, { body: { title, areaBasis: basis, order } });
      router.push(`/fits/${r.fit.id}`);
    } catch (e) {
      setSaveError(e instanceof ApiError ? e.message : 'The server could not be reached.');
    }
  }

  return (
    <div className="space-y-6">
      <form className="card flex flex-wrap items-end gap-4 p-4" onSubmit={(e) => e.preventDefault()} aria-label="Test settings">
        <label>
          <span className="field-label">Area basis</span>
          <select className="field-input" value={basis} onChange={(e) => setBasis(e.target.value as 'gross' | 'aperture')}>
            <option value="gross">Gross{grossAreaM2 !== null ? ` (${grossAreaM2} m²)` : ' (not given)'}</option>
            <option value="aperture">Aperture{apertureAreaM2 !== null ? ` (${apertureAreaM2} m²)` : ' (not given)'}</option>
          </select>
        </label>
        <label>
          <span className="field-label">Curve</span>
          <select className="field-input" value={order} onChange={(e) => setOrder(Number(e.target.value) as 1 | 2)}>
            <option value={2}>Second order (η₀, a₁, a₂)</option>
            <option value={1}>First order (a₂ = 0)</option>
          </select>
        </label>
        {busy ? <span className="text-sm text-ink-muted" role="status">Fitting…</span> : null}
      </form>
      {error ? <p role="alert" className="rounded-lg border border-danger-line bg-danger-bg px-3 py-2 text-sm text-danger-text">{error}</p> : null}
      {result ? (
        <>
          <CollectorReport view={result} />
          {canSave ? (
            <section className="card flex flex-wrap items-end gap-3 p-4" aria-label="Save the collector fit">
              <label className="grow">
                <span className="field-label">Title</span>
                <input className="field-input" value={title} maxLength={160} onChange={(e) => setTitle(e.target.value)} />
              </label>
              <button type="button" className="btn-primary" onClick={save} disabled={busy || !title.trim()}>
                Save collector fit
              </button>
              {saveError ? <p role="alert" className="w-full text-sm text-danger-text">{saveError}</p> : null}
            </section>
          ) : null}
        </>
      ) : null}
    </div>
  );
}
