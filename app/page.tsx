import Link from 'next/link';
import * as Plot from '@observablehq/plot';
import { SiteHeader } from './_components/site-header';
import { plotToSvg } from './_lib/plots/plot-svg';
import { sampleCoilData } from './_lib/plots/sample-curve';
import { HAZARD_BANDS } from '@/analysis/safety/cautions';
import { TemperatureCautions } from './_components/safety-notice';

const SAMPLE_LABEL = 'Sample plot: outlet temperature against flow for an invented coil';
const SAMPLE_DESCRIPTION =
  'Eleven invented trials from 2 to 21 L/min lie along the fitted curve, inside its narrow prediction band: the outlet falls from about 82 °C at 2 L/min to about 36 °C at 21 L/min, toward the 18 °C inlet.';

/** The sample's SVG: the same for every visitor, so drawn once per process (not on every request). */
let sampleSvg: { svg: string; lines: { y: number; text: string; stroke: string }[]; points: { q: number; t: number }[] } | null = null;

function samplePlotSvg() {
  if (sampleSvg) return sampleSvg;
  const { curve, points, tin } = sampleCoilData();
  // the caution thresholds inside the plotted range, with their words (analysis/safety)
  const lines = HAZARD_BANDS.filter((b) => b.thresholdC >= 10 && b.thresholdC <= 90)
    .map((b) => ({ y: b.thresholdC, text: `${b.short} ${b.thresholdC} °C`, stroke: b.level === 'danger' ? '#9B1C13' : '#7A4B00' }));
  const svg = plotToSvg({
    width: 640,
    height: 340,
    marginLeft: 52,
    marginBottom: 44,
    style: { fontFamily: 'Inter, sans-serif', fontSize: '12px', color: '#4A403A', background: 'transparent' },
    ariaLabel: SAMPLE_LABEL,
    ariaDescription: SAMPLE_DESCRIPTION,
    x: { label: 'Flow (L/min) →', domain: [0, 24], grid: true },
    y: { label: '↑ Outlet temperature (°C)', domain: [10, 90], grid: true },
    marks: [
      Plot.areaY(curve, { x: 'q', y1: 'lo', y2: 'hi', fill: '#F8A066', fillOpacity: 0.28 }),
      Plot.lineY(curve, { x: 'q', y: 't', stroke: '#B84E0C', strokeWidth: 2.5 }),
      ...lines.flatMap((l) => [
        Plot.ruleY([l.y], { stroke: l.stroke, strokeDasharray: '6 3', strokeWidth: 1.25 }),
        Plot.text([l], { y: 'y', text: 'text', fill: l.stroke, frameAnchor: 'right', textAnchor: 'end', dx: -4, dy: -7 }),
      ]),
      Plot.ruleY([tin], { stroke: '#0F6E73', strokeDasharray: '4 4' }),
      Plot.text([{ x: 23.5, y: tin + 3 }], { x: 'x', y: 'y', text: () => 'inlet 18 °C', fill: '#0F6E73', textAnchor: 'end' }),
      Plot.dot(points, { x: 'q', y: 't', r: 4.5, fill: '#241E1B', stroke: 'white', strokeWidth: 1.5 }),
    ],
  });
  sampleSvg = { svg, lines, points };
  return sampleSvg;
}

function SamplePlot() {
  const { svg, lines, points } = samplePlotSvg();
  return (
    <figure className="card p-4">
      <div className="overflow-x-auto [&_svg]:h-auto [&_svg]:max-w-full" dangerouslySetInnerHTML={{ __html: svg }} />
      <figcaption className="mt-2 text-sm text-ink-muted">
        Invented sample: eleven bucket trials of a coil over a fire, the fitted constant-source model and its 95 %
        prediction band. Heat delivered keeps rising with flow toward a ceiling of UA·(Ts − Tin) — no false optimum.
        Dashed lines mark the caution thresholds: {lines.map((l) => l.text).join(', ')}.
      </figcaption>
      <div className="mt-3">
        <TemperatureCautions label="Cautions for the sample" places={[{ where: 'sample outlet', valuesC: points.map((p) => p.t) }]} />
      </div>
    </figure>
  );
}

const STEPS = [
  { title: 'Bring in your trials', body: 'Bucket timings typed at the rig, a phone spreadsheet or a 1 Hz logger dump, mapped to the right units and checked row by row.' },
  { title: 'Fit a model that obeys physics', body: 'Effectiveness–NTU coil fits with certified numerics, standard errors, residual diagnostics and a reviewer’s sign-off.' },
  { title: 'Forecast the pool', body: 'How fast a pool or tub of your size will warm, the flow to run, when the water turns dangerous, and what it costs.' },
];

export default function LandingPage() {
  return (
    <>
      <SiteHeader right={<Link className="btn-primary" href="/sign-in">Sign in</Link>} />
      <main id="main" className="mx-auto max-w-page px-4 pb-16 pt-10">
        <section className="grid items-center gap-10 lg:grid-cols-[1fr_1.1fr]">
          <div>
            <p className="text-sm font-semibold uppercase tracking-widest text-ember-700">The heater test workbench</p>
            <h1 className="mt-3 text-3xl sm:text-4xl">
              Emberline turns bucket-and-thermometer trials into heater models you can trust, and tells you how fast your pool will warm.
            </h1>
            <p className="mt-4 text-lg text-ink-soft">
              For people who build and test coils over fires, propane burner loops and solar collectors: import, fit, review,
              forecast and share — with honest uncertainty on every number.
            </p>
            <div className="mt-6 flex flex-wrap gap-3">
              <Link className="btn-primary" href="/sign-in">Open the demo lab</Link>
              <Link className="btn-quiet" href="/help/permissions">Who can do what</Link>
            </div>
          </div>
          <SamplePlot />
        </section>
        <section aria-labelledby="how" className="mt-14">
          <h2 id="how" className="text-xl">How it works</h2>
          <ol className="mt-4 grid gap-4 md:grid-cols-3">
            {STEPS.map((s, i) => (
              <li key={s.title} className="card p-5">
                <span className="num text-sm text-ember-700">0{i + 1}</span>
                <h3 className="mt-1 text-lg">{s.title}</h3>
                <p className="mt-2 text-ink-soft">{s.body}</p>
              </li>
            ))}
          </ol>
        </section>
      </main>
    </>
  );
}
