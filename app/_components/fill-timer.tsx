'use client';

import { useEffect, useState } from 'react';

/**
 * The bucket fill timer, sized for a thumb: start when the bucket goes under the stream, stop when
 * it is full; each fill is listed and can be removed. Times in s, to 0.1 s.
 */
export function FillTimer({ fills, onChange }: { fills: number[]; onChange: (fills: number[]) => void }) {
  const [runningSince, setRunningSince] = useState<number | null>(null);
  const [now, setNow] = useState(0);

  useEffect(() => {
    if (runningSince === null) return;
    const id = setInterval(() => setNow(performance.now()), 100);
    return () => clearInterval(id);
  }, [runningSince]);

  const toggle = () => {
    if (runningSince === null) {
      const t0 = performance.now();
      setRunningSince(t0);
      setNow(t0);
    } else {
      const s = Math.round((performance.now() - runningSince) / 100) / 10;
      onChange([...fills, s]);
      setRunningSince(null);
    }
  };
  const elapsed = runningSince === null ? null : (now - runningSince) / 1000;

  return (
    <div>
      <button
        type="button"
        onClick={toggle}
        className={`w-full rounded-xl py-5 text-xl font-semibold text-white ${runningSince === null ? 'bg-water-600 hover:bg-water-800' : 'bg-ember-600 hover:bg-ember-700'}`}
        aria-live="polite"
      >
        {runningSince === null ? (fills.length ? 'Start another fill' : 'Start fill timer') : `Stop · ${elapsed!.toFixed(1)} s`}
      </button>
      <ul className="mt-3 flex flex-wrap gap-2" aria-label="Fill times">
        {fills.map((s, i) => (
          <li key={i} className="num flex items-center gap-1 rounded-full bg-paper-deep px-3 py-1 text-sm">
            {s.toFixed(1)} s
            <button type="button" aria-label={`Remove fill ${i + 1}`} className="text-ink-muted hover:text-danger-text" onClick={() => onChange(fills.filter((_, j) => j !== i))}>
              ×
            </button>
          </li>
        ))}
      </ul>
      <p className="mt-2 text-xs text-ink-muted">Time three fills or more and aim for 30 s or longer each: human timing error is then under 1 %.</p>
    </div>
  );
}
