'use client';

/** The settings of a tub-fill block in the study editor: the saved coil fit, the tub, the fill flow, the supply and the target (each typed with its unit). */
type Data = Record<string, unknown>;

const FIELDS = [
  ['tubVolume', 'Tub volume'], ['flow', 'Fill flow'], ['supplyTemp', 'Supply'], ['targetTemp', 'Target (optional)'],
  ['initialVolume', 'Already in the tub (optional)'], ['initialTemp', 'Its temperature'],
] as const;

export function TubFillSettings({ n, data, set, fits }: { n: number; data: Data; set: (d: Data) => void; fits: { id: string; label: string; coil: boolean }[] }) {
  return (
    <div className="grid gap-2 sm:grid-cols-3">
      <label className="text-sm sm:col-span-3">
        <span className="field-label">Heater (saved coil fit)</span>
        <select aria-label={`Coil fit of block ${n}`} className="field-input" value={String(data.fitId ?? '')} onChange={(e) => set({ fitId: e.target.value || undefined })}>
          <option value="">Choose a saved coil fit…</option>
          {fits.filter((f) => f.coil).map((f) => <option key={f.id} value={f.id}>{f.label}</option>)}
        </select>
      </label>
      {FIELDS.map(([k, label]) => (
        <label key={k} className="text-sm">
          <span className="field-label">{label}</span>
          <input aria-label={`${label} of block ${n}`} className="field-input num" value={String(data[k] ?? '')} onChange={(e) => set({ [k]: e.target.value.trim() ? e.target.value : undefined })} />
        </label>
      ))}
      <p className="text-xs text-ink-muted sm:col-span-3">Quantities take units (L, gal, L/min, gpm, degC, degF). A tub above 40 °C (104 °F) is dangerous: fill below it and check before anyone gets in.</p>
    </div>
  );
}
