import { describe, expect, test } from 'vitest';
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import {
  cautionsToShow, deadHeadingCaution, HAZARD_BANDS, hazardBand, hottestCautions, mergeCautions, sourceAboveBoilingCaution, temperatureCautions,
} from '../../../analysis/safety/cautions';

// Thresholds and their basis (DOMAIN.md §5, §3.7): 40 °C spa limit — CPSC advisory 79-071 (104 °F) and
// UL 1563 §32 (40 °C maximum set point) [38]; 49 °C scald caution and 60 °C "burns in seconds" — the
// scald-time table [39] (120 °F > 5 min, 140 °F < 5 s; check value #18); 95 °C near boiling, flashing
// to steam when released — common practice. Each rule is reached at or above its threshold.
describe('temperature cautions (DOMAIN.md §5, §3.7): at or above each threshold', () => {
  test.each([
    [38, []],
    [39.99, []],
    [40, ['spa-limit']], // CPSC 104 °F / UL 1563: 40 °C is the limit itself, so 40 °C is already at it
    [40.5, ['spa-limit']],
    [48.99, ['spa-limit']],
    [49, ['scald', 'spa-limit']], // [39]: 120 °F (48.9 °C) scalds in > 5 min; the product rule flags 49 °C
    [59.99, ['scald', 'spa-limit']],
    [60, ['scald-seconds', 'scald', 'spa-limit']], // [39]: 140 °F (60 °C) burns in < 5 s, check value #18
    [94.99, ['scald-seconds', 'scald', 'spa-limit']],
    [95, ['near-boiling', 'scald-seconds', 'scald', 'spa-limit']], // common practice: near boiling, steam risk
  ])('%s °C raises %j', (t, codes) => {
    expect(temperatureCautions(t, 'outlet').map((c) => c.code)).toEqual(codes);
  });
  test('each caution carries level, threshold, value and a message that defers to local codes', () => {
    const [c] = temperatureCautions(61, 'pool');
    expect(c).toMatchObject({ level: 'danger', thresholdC: 60, valueC: 61, where: 'pool' });
    expect(c.message).toMatch(/local codes/);
  });
  test('water at or above boiling is said to boil, not to be close to boiling (IF97: 99.97 °C at 1 atm)', () => {
    expect(temperatureCautions(120, 'coil water')[0].message).toMatch(/at or above boiling/);
    expect(temperatureCautions(96, 'outlet')[0].message).toMatch(/close to boiling/);
  });
  test('dead-heading caution is a danger and says to run the pump before the fire and until the coil is cold', () => {
    const c = deadHeadingCaution('step 2');
    expect(c).toMatchObject({ code: 'dead-heading', level: 'danger' });
    expect(c.message).toMatch(/^Step 2: /);
    expect(c.message).toMatch(/pump before lighting the fire and keep it running until the coil is cold/);
  });
  test('a source above boiling raises its own caution', () => {
    expect(sourceAboveBoilingCaution(150, 99.97)?.code).toBe('above-boiling-source');
    expect(sourceAboveBoilingCaution(90, 99.97)).toBeNull();
  });
  test('merging keeps the highest value per code and place, most severe first', () => {
    const m = mergeCautions(temperatureCautions(45, 'outlet'), temperatureCautions(52, 'outlet'));
    expect(m.map((c) => [c.code, c.valueC])).toEqual([['scald', 52], ['spa-limit', 52]]);
  });
  test('the message states the reader’s unit first (NIST SP 811: °F = 1.8·°C + 32)', () => {
    const [c] = temperatureCautions(62, 'outlet', 'us');
    expect(c.message).toMatch(/^The outlet water reaches 143\.6 °F \(62\.0 °C\): at or above 140 °F \(60 °C\) water burns skin in seconds/);
    expect(temperatureCautions(62, 'outlet')[0].message).toMatch(/^The outlet water reaches 62\.0 °C \(144 °F\): at or above 60 °C \(140 °F\)/);
    expect(hottestCautions([{ where: 'tub', valuesC: [41] }], 'us')[0].message).toMatch(/105\.8 °F \(41\.0 °C\), at or above the 104 °F \(40 °C\) limit/);
  });
  test('NaN is a TypeError', () => expect(() => temperatureCautions(Number.NaN, 'x')).toThrow(TypeError));
});

describe('hazard band of a temperature, for the marks beside values', () => {
  test.each([
    [39.9, 'none', ''],
    [40, 'spa', 'at or above the 40 °C spa limit'], // CPSC / UL 1563 [38]
    [48.9, 'spa', 'at or above the 40 °C spa limit'],
    [49, 'scald', 'at or above 49 °C: can scald'], // scald-time table [39]
    [60, 'seconds', 'at or above 60 °C: burns in seconds'], // [39]: 140 °F < 5 s
    [95, 'steam', 'at or above 95 °C: near boiling, flashes to steam when released'], // common practice
    [130, 'steam', 'at or above 95 °C: near boiling, flashes to steam when released'],
  ])('%s °C is in band %s', (t, band, label) => {
    const h = hazardBand(t);
    expect(h.band).toBe(band);
    expect(h.label).toBe(label);
  });
  test('the label follows the reader’s units: 40 °C = 104 °F, 49 °C ≈ 120 °F, 60 °C = 140 °F, 95 °C = 203 °F (NIST SP 811: °F = 1.8·°C + 32)', () => {
    expect(hazardBand(41, 'us').label).toBe('at or above the 104 °F spa limit');
    expect(hazardBand(50, 'us').label).toBe('at or above 120 °F: can scald');
    expect(hazardBand(61, 'us').label).toBe('at or above 140 °F: burns in seconds');
    expect(hazardBand(99, 'us').label).toBe('at or above 203 °F: near boiling, flashes to steam when released');
  });
  test('the band and the cautions agree: the most severe caution is the band’s own rule', () => {
    for (let t = 30; t <= 110; t += 0.25) {
      const h = hazardBand(t);
      const first = temperatureCautions(t, 'outlet')[0];
      expect(h.rule?.code ?? null, `${t} °C`).toBe(first?.code ?? null);
    }
  });
  test('bands are listed most severe first with the thresholds of the cautions', () => {
    expect(HAZARD_BANDS.map((b) => [b.band, b.thresholdC])).toEqual([['steam', 95], ['seconds', 60], ['scald', 49], ['spa', 40]]);
  });
  test('a NaN is a TypeError', () => expect(() => hazardBand(Number.NaN)).toThrow(TypeError));
});

describe('caution lists keep every hazard and every place', () => {
  test('the pool and the outlet over the same threshold are two cautions, also when shown (the forecast of a hot tub)', () => {
    // a tub forecast whose water reaches 45 °C while the heater outlet reaches 70 °C: spa limit at both places
    const merged = mergeCautions(temperatureCautions(45, 'tub'), temperatureCautions(70, 'outlet'));
    const shown = cautionsToShow(merged);
    expect(shown.map((c) => `${c.code}@${c.where}`)).toEqual(['scald-seconds@outlet', 'scald@outlet', 'spa-limit@tub', 'spa-limit@outlet']);
    // on screen: each place once, at its most severe band (the outlet burns in seconds, the tub is over the spa limit)
    expect(cautionsToShow(merged, { bands: 'highest' }).map((c) => `${c.code}@${c.where}`)).toEqual(['scald-seconds@outlet', 'spa-limit@tub']);
    const both45 = cautionsToShow(mergeCautions(temperatureCautions(45, 'tub'), temperatureCautions(45, 'outlet')), { bands: 'highest' });
    expect(both45.map((c) => `${c.code}@${c.where}`)).toEqual(['spa-limit@tub', 'spa-limit@outlet']);
  });
  // Thresholds as above (CPSC 79-071 / UL 1563 [38]; scald-time table [39]; 95 °C steam, common practice):
  // a screen shows the contact band hazardBand marks the value with, not every lower band under it;
  // near boiling (steam and pressure) is a hazard of its own and stays beside the burns.
  test.each([
    [42, ['spa-limit']],
    [52, ['scald']],
    [62, ['scald-seconds']],
    [96, ['near-boiling', 'scald-seconds']],
  ])('on screen, one temperature at %s °C shows one caution per hazard, the highest contact band (%j), in the rule’s words', (t, codes) => {
    const all = temperatureCautions(t, 'planned outlet (upper prediction bound)');
    const shown = cautionsToShow(all, { bands: 'highest' });
    expect(shown.map((c) => c.code)).toEqual(codes);
    expect(shown[0].code).toBe(hazardBand(t).rule?.code);
    for (const c of shown) expect(c.message).toBe(all.find((x) => x.code === c.code)!.message);
    expect(cautionsToShow(all)).toHaveLength(all.length); // the default (exports) keeps every band
  });
  test('on screen, other hazards stay beside the highest band', () => {
    const shown = cautionsToShow([...temperatureCautions(96, 'outlet'), sourceAboveBoilingCaution(150, 99.97)!, deadHeadingCaution('step 2')], { bands: 'highest' });
    // all danger: the highest threshold first (99.97 °C, 95 °C, then the one without a threshold)
    expect(shown.map((c) => `${c.code}@${c.where}`)).toEqual(['above-boiling-source@source', 'near-boiling@outlet', 'scald-seconds@outlet', 'dead-heading@step 2']);
  });
  test('two steps of a plan without flow stay two cautions; the same caution twice is shown once', () => {
    const a = deadHeadingCaution('step 2'), b = deadHeadingCaution('step 5');
    expect(mergeCautions([a], [b]).map((c) => c.where)).toEqual(['step 2', 'step 5']);
    expect(cautionsToShow([a, a, b])).toHaveLength(2);
  });
  test('two different hazards under one code stay apart: a source above boiling at two pressures', () => {
    const sea = sourceAboveBoilingCaution(150, 99.97)!, hill = sourceAboveBoilingCaution(150, 95.0)!; // saturation at 1 atm and ≈ 84.5 kPa (IF97)
    expect(mergeCautions([sea], [hill])).toHaveLength(2);
  });
  test('cautions without where (JSON from an older saved result) are still shown once each, worst first', () => {
    const list = [{ code: 'scald', level: 'warning', message: 'a' }, { code: 'near-boiling', level: 'danger', message: 'b' }, { code: 'scald', level: 'warning', message: 'a' }];
    expect(cautionsToShow(list).map((c) => c.message)).toEqual(['b', 'a']);
    // near boiling and the scald are two hazards (steam; contact): both stay on screen
    expect(cautionsToShow(list, { bands: 'highest' }).map((c) => c.message)).toEqual(['b', 'a']);
    const contact = [{ code: 'scald', level: 'warning', message: 'a' }, { code: 'scald-seconds', level: 'danger', message: 'c' }];
    expect(cautionsToShow(contact, { bands: 'highest' }).map((c) => c.message)).toEqual(['c']);
  });
  test('the hottest value of each place gives the cautions beside a table', () => {
    const c = hottestCautions([{ where: 'inlet', valuesC: [15, 18] }, { where: 'outlet', valuesC: [38, 52, Number.NaN, null, 47] }]);
    expect(c.map((x) => `${x.code}@${x.where}=${x.valueC}`)).toEqual(['scald@outlet=52', 'spa-limit@outlet=52']);
    expect(hottestCautions([{ where: 'outlet', valuesC: [] }])).toEqual([]);
  });
});

/** Every `where` the code base passes to a caution template (grepped from the callers). */
function callerPlaces(): string[] {
  const root = join(__dirname, '../../..');
  const files: string[] = [];
  const walk = (d: string) => {
    for (const e of readdirSync(d, { withFileTypes: true })) {
      if (e.name === 'node_modules' || e.name.startsWith('.')) continue;
      const p = join(d, e.name);
      if (e.isDirectory()) walk(p);
      else if (/\.(ts|tsx)$/.test(e.name)) files.push(p);
    }
  };
  walk(join(root, 'analysis'));
  walk(join(root, 'app'));
  const places = new Set<string>();
  const patterns = [
    /temperatureCautions\([^;']*?,\s*'([^']+)'(?:,\s*\w+)?\)/g,
    /deadHeadingCaution\('([^']+)'\)/g,
    /\{\s*where:\s*'([^']+)'\s*,\s*valuesC/g,
  ];
  for (const f of files) {
    const text = readFileSync(f, 'utf8');
    for (const re of patterns) for (const m of text.matchAll(re)) places.add(m[1]);
  }
  return [...places].sort();
}

describe('caution wording', () => {
  const places = callerPlaces();
  test('the callers were found (outlet, pool, tub, coil water, mixed water, dead-heading places)', () => {
    expect(places).toEqual(expect.arrayContaining(['outlet', 'pool', 'tub', 'coil water', 'mixed water', 'planned outlet (upper prediction bound)', 'zero flow', 'this trial', 'the fill', 'logged outlet', 'sample outlet']));
  });
  test('no template doubles a word with any place the code base passes ("the mixed water water")', () => {
    const messages = places.flatMap((w) => [
      ...[40, 49, 60, 95, 120].flatMap((t) => [...temperatureCautions(t, w), ...temperatureCautions(t, w, 'us')].map((c) => c.message)),
      deadHeadingCaution(w).message,
    ]);
    messages.push(sourceAboveBoilingCaution(150, 99.97)!.message);
    for (const m of messages) expect(m, m).not.toMatch(/\b(\w+)\s+\1\b/i);
  });
  test('a place that names the water is not given a second "water"; one that does not, is', () => {
    expect(temperatureCautions(50, 'mixed water')[0].message).toMatch(/^The mixed water reaches/);
    expect(temperatureCautions(50, 'outlet')[0].message).toMatch(/^The outlet water reaches/);
    expect(temperatureCautions(50, 'planned outlet (upper prediction bound)')[0].message).toMatch(/^The planned outlet water \(upper prediction bound\) reaches/);
  });
});

import { planCautions } from '../../../analysis/safety/plan-check';

describe('test-plan check (DOMAIN.md §5 dead-heading)', () => {
  test('zero flow or a closed valve on a heated coil is a danger; an unheated step is not', () => {
    const c = planCautions([
      { flowM3PerS: 1e-4 },
      { flowM3PerS: 0, label: 'shut-off test' },
      { flowM3PerS: 1e-4, valveClosed: true },
      { flowM3PerS: 0, heated: false },
    ]);
    expect(c.map((x) => x.where)).toEqual(['shut-off test', 'step 3']);
    expect(c.every((x) => x.level === 'danger' && x.code === 'dead-heading')).toBe(true);
  });
  test('a NaN flow is a TypeError naming the step', () => {
    expect(() => planCautions([{ flowM3PerS: Number.NaN }])).toThrow(/steps\[0\]\.flowM3PerS/);
  });
});
