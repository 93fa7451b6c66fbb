'use client';

import type { UnitSystem } from '@/analysis/units/unit-system';
import { CostSettings, ForecastSettings, SensorLogSettings } from './block-settings';
import { TubFillSettings } from './tub-fill-settings';
import { kindLabel, type Block, type EditorChoices } from './study-blocks-model';

/** One block in the editor: its number and kind, move up / down / delete, and its settings by kind. */
export function BlockItem({ block: b, i, blocks, units, choices, setData, move, remove }: {
  block: Block;
  i: number;
  blocks: readonly Block[];
  units: UnitSystem;
  choices: EditorChoices;
  setData: (d: Record<string, unknown>) => void;
  move: (by: number) => void;
  remove: () => void;
}) {
  const { fits, logs, comparisons, plans } = choices;
  return (
    <li className="rounded-lg border border-paper-line p-3">
      <div className="mb-2 flex flex-wrap items-center justify-between gap-2">
        <span className="text-sm font-semibold">
          {i + 1}. {kindLabel(b.kind)}
        </span>
        <span className="flex gap-1">
          <button type="button" className="btn-quiet px-2 py-1" aria-label={`Move block ${i + 1} up`} onClick={() => move(-1)}>
            ↑
          </button>
          <button type="button" className="btn-quiet px-2 py-1" aria-label={`Move block ${i + 1} down`} onClick={() => move(1)}>
            ↓
          </button>
          <button type="button" className="btn-quiet px-2 py-1" aria-label={`Delete block ${i + 1}`} onClick={remove}>
            ✕
          </button>
        </span>
      </div>
      {b.kind === 'text' ? (
        <textarea aria-label={`Markdown of block ${i + 1}`} className="field-input font-mono text-sm" rows={5} value={String(b.data.markdown ?? '')} onChange={(e) => setData({ markdown: e.target.value })} />
      ) : b.kind === 'caution' ? (
        <input aria-label={`Extra caution of block ${i + 1}`} className="field-input" placeholder="A caution of your own (the standing ones are always shown)" value={String(b.data.text ?? '')} onChange={(e) => setData({ text: e.target.value })} />
      ) : b.kind === 'forecast' ? (
        <ForecastSettings data={b.data} set={setData} fits={fits} />
      ) : b.kind === 'costs' ? (
        <CostSettings n={i + 1} data={b.data} set={setData} units={units} forecasts={blocks.map((x, j) => ({ id: x.id, kind: x.kind, n: j + 1 })).filter((x) => x.kind === 'forecast')} />
      ) : b.kind === 'tub-fill' ? (
        <TubFillSettings n={i + 1} data={b.data} set={setData} fits={fits} />
      ) : b.kind === 'sensor-log' ? (
        <SensorLogSettings n={i + 1} data={b.data} set={setData} logs={logs} />
      ) : b.kind === 'operating-plan' ? (
        <select aria-label={`Operating plan of block ${i + 1}`} className="field-input" value={String(b.data.planId ?? '')} onChange={(e) => setData({ planId: e.target.value || undefined })}>
          <option value="">{plans.length ? 'Choose an operating plan…' : 'No operating plan saved yet: make one on a rig’s page'}</option>
          {plans.map((p) => (
            <option key={p.id} value={p.id}>
              {p.label}
            </option>
          ))}
        </select>
      ) : b.kind === 'design-comparison' ? (
        <select aria-label={`Design comparison of block ${i + 1}`} className="field-input" value={String(b.data.comparisonId ?? '')} onChange={(e) => setData({ comparisonId: e.target.value || undefined })}>
          <option value="">{comparisons.length ? 'Choose a saved comparison…' : 'No comparison saved yet: make one under Compare'}</option>
          {comparisons.map((c) => (
            <option key={c.id} value={c.id}>
              {c.label}
            </option>
          ))}
        </select>
      ) : (
        <select aria-label={`Saved fit of block ${i + 1}`} className="field-input" value={String(b.data.fitId ?? '')} onChange={(e) => setData({ fitId: e.target.value || undefined })}>
          <option value="">Choose a saved fit…</option>
          {fits.filter((f) => (b.kind === 'collector') === !!f.collector).map((f) => (
            <option key={f.id} value={f.id}>
              {f.label}
            </option>
          ))}
        </select>
      )}
    </li>
  );
}
