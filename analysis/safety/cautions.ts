/**
 * Structured safety cautions that travel with every predicted or measured water temperature.
 * Thresholds follow DOMAIN.md §5 and §3.7, each reached at or above it: 40 °C spa limit (CPSC
 * advisory, UL 1563), 49 °C scald caution and 60 °C "burns in seconds" (scald-time tables after
 * Henriques & Moritz), 95 °C near boiling with a steam risk (common practice). Scald cautions also state the time to a serious scald at the
 * temperature (scald-time.ts, DOMAIN.md §5 [39]). Wording is Emberline's own and defers to local codes.
 */
import { scaldTime } from './scald-time';
import { celsiusToFahrenheit } from '../units/exact-factors';
import type { UnitSystem } from '../units/unit-system';

/** How serious a caution is: `notice` < `warning` < `danger`. */
export type CautionLevel = 'notice' | 'warning' | 'danger';

/** Which rule raised the caution. */
export type CautionCode =
  | 'spa-limit'
  | 'scald'
  | 'scald-seconds'
  | 'near-boiling'
  | 'dead-heading'
  | 'pump-after-fire'
  | 'closed-loop-no-relief'
  | 'pump-stopped-hot'
  | 'plan-ends-lit'
  | 'above-boiling-source'
  | 'analysis-aid';

/** One caution: machine-readable code and level, the threshold crossed, and a message. */
export interface Caution {
  code: CautionCode;
  level: CautionLevel;
  /** threshold temperature, °C (null for cautions that are not a temperature threshold) */
  thresholdC: number | null;
  /** the temperature that crossed it, °C (null when not applicable) */
  valueC: number | null;
  /** what the temperature is: 'outlet', 'pool', 'tub', 'source'… */
  where: string;
  message: string;
}

/** The temperature thresholds, °C, lowest first. */
export const CAUTION_THRESHOLDS_C = {
  spaLimit: 40,
  scald: 49,
  scaldSeconds: 60,
  nearBoiling: 95,
} as const;

/** The sentence every caution ends with: the product is an aid, not an approval (DOMAIN.md §5). */
export const CAUTION_DEFER = 'This is an analysis aid, not a design approval: follow local codes and licensed practice.';
const DEFER = CAUTION_DEFER;

/** Boiling at 1 atm, °C (IAPWS-IF97 saturation temperature at 101.325 kPa, rounded). */
const BOILING_1ATM_C = 99.97;

/** A temperature in both units, the reader's first: '62.0 °C (144 °F)' or '143.6 °F (62.0 °C)'. */
function fmt(c: number, units: UnitSystem = 'si'): string {
  return units === 'us' ? `${celsiusToFahrenheit(c).toFixed(1)} °F (${c.toFixed(1)} °C)` : `${c.toFixed(1)} °C (${celsiusToFahrenheit(c).toFixed(0)} °F)`;
}

/** A threshold in both units, the reader's first: '60 °C (140 °F)' or '140 °F (60 °C)'. */
const limit = (c: number, units: UnitSystem) => (units === 'us' ? `${thresholdText(c, 'us')} (${thresholdText(c)})` : `${thresholdText(c)} (${thresholdText(c, 'us')})`);

function exposure(c: number): string {
  const t = scaldTime(c).text.replace(/^longer than/, 'more than').replace(/^shorter than/, 'less than');
  return `At this temperature a serious scald takes ${t} of contact (published scald-time table), and less for children and older people.`;
}

/**
 * The water a caution speaks of, without doubling the word: 'outlet' → 'the outlet water',
 * 'mixed water' → 'the mixed water', 'the fill' → 'the fill'.
 */
function theWater(where: string): string {
  const w = where.trim();
  const named = /^(the|this|that|a|an)\b/i.test(w) ? w : `the ${w}`;
  if (/\bwater\b/i.test(w)) return named;
  // 'planned outlet (upper prediction bound)' → 'the planned outlet water (upper prediction bound)'
  const paren = /^(.*?\S)\s*(\([^()]*\))$/.exec(named);
  return paren ? `${paren[1]} water ${paren[2]}` : `${named} water`;
}

/** First letter up, for a `where` that starts a sentence. */
const capital = (s: string) => s.charAt(0).toUpperCase() + s.slice(1);

/**
 * The hazard bands of a water temperature, lowest first (DOMAIN.md §5, §3.7): `spa` from 40 °C
 * (CPSC advisory 79-071, UL 1563 [38]), `scald` from 49 °C and `seconds` from 60 °C (the
 * scald-time table [39], Henriques & Moritz [39c]), `steam` from 95 °C (near boiling: flashes to
 * steam where pressure drops; common practice). Each band starts *at* its threshold.
 */
export type HazardBand = 'none' | 'spa' | 'scald' | 'seconds' | 'steam';

/** One band: the rule that raises it, its threshold and its words. */
export interface HazardBandRule {
  band: Exclude<HazardBand, 'none'>;
  code: Extract<CautionCode, 'spa-limit' | 'scald' | 'scald-seconds' | 'near-boiling'>;
  level: CautionLevel;
  /** the band starts at this temperature, °C (at or above) */
  thresholdC: number;
  /** a word or two for a caution heading: 'spa limit', 'scald risk', 'burns in seconds', 'steam risk' */
  short: string;
  /** one word for a badge beside a value in a table: 'spa', 'scald', 'burns', 'steam' */
  tag: string;
  /** what crossing it means, after "at or above 49 °C: " */
  meaning: string;
}

/** The bands, most severe first (the order cautions are listed in). */
export const HAZARD_BANDS: readonly HazardBandRule[] = [
  { band: 'steam', code: 'near-boiling', level: 'danger', thresholdC: CAUTION_THRESHOLDS_C.nearBoiling, short: 'steam risk', tag: 'steam', meaning: 'near boiling, it can flash to steam when released' },
  { band: 'seconds', code: 'scald-seconds', level: 'danger', thresholdC: CAUTION_THRESHOLDS_C.scaldSeconds, short: 'burns in seconds', tag: 'burns', meaning: 'water burns skin in seconds' },
  { band: 'scald', code: 'scald', level: 'warning', thresholdC: CAUTION_THRESHOLDS_C.scald, short: 'scald risk', tag: 'scald', meaning: 'water can scald' },
  { band: 'spa', code: 'spa-limit', level: 'warning', thresholdC: CAUTION_THRESHOLDS_C.spaLimit, short: 'spa limit', tag: 'spa', meaning: 'above the limit for spas and tubs' },
];

/** A threshold in words, in the unit system of the reader: '49 °C' or '120 °F' (rounded to 1 °F). */
export function thresholdText(thresholdC: number, units: UnitSystem = 'si'): string {
  return units === 'us' ? `${Math.round(celsiusToFahrenheit(thresholdC))} °F` : `${thresholdC} °C`;
}

/** The hazard band of one temperature, with its words for a mark beside the value. */
export interface TemperatureHazard {
  band: HazardBand;
  /** the rule of the band (null for `none`) */
  rule: HazardBandRule | null;
  /** short words ('' for `none`) */
  short: string;
  /** one word for a badge ('' for `none`) */
  tag: string;
  /** the reason in words, e.g. 'at or above the 40 °C spa limit' ('' for `none`) */
  label: string;
}

/**
 * The hazard band a water temperature falls in, and a short label in words, so that every
 * screen and export marks hot values alike. Bands start at their thresholds (at or above).
 * @param tempC the temperature, °C
 * @param units the unit system of the label ('si' default: °C; 'us': °F)
 * @throws TypeError when `tempC` is not a finite number.
 * @example hazardBand(40).label // 'at or above the 40 °C spa limit'
 * @example hazardBand(62, 'us').label // 'at or above 140 °F: burns in seconds'
 * @example hazardBand(39.9).band // 'none'
 */
export function hazardBand(tempC: number, units: UnitSystem = 'si'): TemperatureHazard {
  if (typeof tempC !== 'number' || !Number.isFinite(tempC)) throw new TypeError(`tempC must be a finite number, got ${String(tempC)}`);
  const rule = HAZARD_BANDS.find((r) => tempC >= r.thresholdC) ?? null;
  if (!rule) return { band: 'none', rule: null, short: '', tag: '', label: '' };
  const t = thresholdText(rule.thresholdC, units);
  const label = rule.band === 'spa' ? `at or above the ${t} spa limit`
    : rule.band === 'steam' ? `at or above ${t}: near boiling, flashes to steam when released`
      : `at or above ${t}: ${rule.band === 'scald' ? 'can scald' : 'burns in seconds'}`;
  return { band: rule.band, rule, short: rule.short, tag: rule.tag, label };
}

/**
 * Cautions for a water temperature that people may touch or that sits in a heater. Returns one
 * entry per threshold reached (at or above it), most severe first; an empty array below 40 °C.
 * The `scald` and `scald-seconds` messages include the time to a serious scald (scald-time.ts).
 * @param tempC the predicted or measured temperature, °C
 * @param where what the temperature is, e.g. 'outlet', 'pool', 'tub', 'mixed water'
 * @param units which unit the message states first ('si' default: °C, then °F)
 * @throws TypeError when `tempC` is not a finite number.
 * @example temperatureCautions(62, 'outlet').map(c => c.code) // ['scald-seconds', 'scald', 'spa-limit']
 * @example temperatureCautions(40, 'tub')[0].code // 'spa-limit'
 */
export function temperatureCautions(tempC: number, where: string, units: UnitSystem = 'si'): Caution[] {
  if (typeof tempC !== 'number' || !Number.isFinite(tempC)) {
    throw new TypeError(`tempC must be a finite number, got ${String(tempC)}`);
  }
  const out: Caution[] = [];
  const T = CAUTION_THRESHOLDS_C;
  const water = capital(theWater(where));
  if (tempC >= T.nearBoiling) {
    const state = tempC >= BOILING_1ATM_C
      ? 'at or above boiling at atmospheric pressure: in a closed coil it boils and builds pressure, and it flashes to steam when released'
      : 'close to boiling: it can flash to steam where pressure drops';
    out.push({
      code: 'near-boiling', level: 'danger', thresholdC: T.nearBoiling, valueC: tempC, where,
      message: `${water} reaches ${fmt(tempC, units)}, ${state}. Keep an open vent or a certified relief valve on any heated loop that can be closed, raise the flow, and never valve off a heated coil. ${DEFER}`,
    });
  }
  if (tempC >= T.scaldSeconds) {
    out.push({
      code: 'scald-seconds', level: 'danger', thresholdC: T.scaldSeconds, valueC: tempC, where,
      message: `${water} reaches ${fmt(tempC, units)}: at or above ${limit(T.scaldSeconds, units)} water burns skin in seconds. ${exposure(tempC)} Keep it away from anyone's reach. ${DEFER}`,
    });
  }
  if (tempC >= T.scald) {
    out.push({
      code: 'scald', level: 'warning', thresholdC: T.scald, valueC: tempC, where,
      message: `${water} reaches ${fmt(tempC, units)}: at or above ${limit(T.scald, units)} water can scald; keep water people touch below it. ${exposure(tempC)} ${DEFER}`,
    });
  }
  if (tempC >= T.spaLimit) {
    out.push({
      code: 'spa-limit', level: 'warning', thresholdC: T.spaLimit, valueC: tempC, where,
      message: `${water} reaches ${fmt(tempC, units)}, at or above the ${limit(T.spaLimit, units)} limit commonly set for spas and tubs; fit a high-limit cut-out and check the water with an accurate thermometer. ${DEFER}`,
    });
  }
  return out;
}

/**
 * The dead-heading and steam caution for a plan with zero flow (or a closed valve) through a
 * heated coil. Always level `danger`.
 * @param where which step or trial of the plan, for the message
 * @example deadHeadingCaution('trial 3').code // 'dead-heading'
 */
export function deadHeadingCaution(where: string): Caution {
  return {
    code: 'dead-heading', level: 'danger', thresholdC: null, valueC: null, where,
    message: `${capital(where.trim())}: no water flows through a heated coil. A coil with no flow over a fire or burner is a boiler: the water can boil, build pressure and flash to steam, and a pump run against a closed valve heats its own water until it boils. Start the pump before lighting the fire and keep it running until the coil is cold, and keep an unvalved vent or a certified relief valve. ${DEFER}`,
  };
}

/**
 * An operating plan lights the fire before water flows through the coil (DOMAIN.md §5: start flow
 * before lighting; common practice). Always level `danger`.
 * @param where which step of the plan, for the message
 * @example pumpAfterFireCaution('step 2 (fire lit)').code // 'pump-after-fire'
 */
export function pumpAfterFireCaution(where: string): Caution {
  return {
    code: 'pump-after-fire', level: 'danger', thresholdC: null, valueC: null, where,
    message: `${capital(where.trim())}: the fire is lit before water flows through the coil. Water standing in a coil over a fire boils within minutes, and a pump started against a hot coil can flash that water to steam. Start the pump, open the valves and set the flow first, then light the fire. ${DEFER}`,
  };
}

/**
 * An operating plan heats a closed loop with no relief valve and no open vent (DOMAIN.md §5:
 * a certified relief valve or an open, unvalved vent on any heated loop that can be closed;
 * common practice). Always level `danger`.
 * @param where which step of the plan, for the message
 * @example closedLoopNoReliefCaution('step 3 (fire lit)').level // 'danger'
 */
export function closedLoopNoReliefCaution(where: string): Caution {
  return {
    code: 'closed-loop-no-relief', level: 'danger', thresholdC: null, valueC: null, where,
    message: `${capital(where.trim())}: a closed loop is heated with no relief path. Heated water expands and, if it boils, builds pressure until something bursts. Fit a certified temperature-and-pressure relief valve, or keep an open vent with no valve on it, and pipe its discharge to a safe place. ${DEFER}`,
  };
}

/**
 * An operating plan stops the pump while the fire burns or the coil is still hot (DOMAIN.md §5:
 * keep flow until the coil is cold; common practice). Always level `danger`.
 * @param where which step of the plan, for the message
 * @param why what is still hot, e.g. 'the fire is still lit'
 * @example pumpStoppedHotCaution('step 6 (pump off)', 'the fire is still lit').code // 'pump-stopped-hot'
 */
export function pumpStoppedHotCaution(where: string, why: string): Caution {
  return {
    code: 'pump-stopped-hot', level: 'danger', thresholdC: null, valueC: null, where,
    message: `${capital(where.trim())}: the pump stops while ${why.trim()}. The water left in a hot coil boils and can burst out as steam. Put the fire out, keep the pump running until the coil is cold to the touch, and only then stop it. ${DEFER}`,
  };
}

/**
 * An operating plan ends with the fire still lit: nobody is told to put it out and cool the coil
 * (common practice). Level `warning`.
 * @param where the last step of the plan, for the message
 * @example planEndsLitCaution('step 4 (the end of the plan)').level // 'warning'
 */
export function planEndsLitCaution(where: string): Caution {
  return {
    code: 'plan-ends-lit', level: 'warning', thresholdC: null, valueC: null, where,
    message: `${capital(where.trim())}: the plan ends with the fire still lit. Add the steps that end a run safely: fire out, the pump kept running until the coil is cold, then the pump off. ${DEFER}`,
  };
}

/**
 * Caution when the heat source is above the boiling point, so the outlet can boil at low flow.
 * @param sourceTempC source (effective) temperature, °C
 * @param boilingC boiling point at the coil's pressure, °C (≈ 99.97 at 1 atm)
 * @returns the caution, or null when the source is at or below boiling
 * @example sourceAboveBoilingCaution(150, 99.97)?.level // 'danger'
 */
export function sourceAboveBoilingCaution(sourceTempC: number, boilingC: number): Caution | null {
  if (!(sourceTempC > boilingC)) return null;
  return {
    code: 'above-boiling-source', level: 'danger', thresholdC: boilingC, valueC: sourceTempC, where: 'source',
    message: `The heat source runs at ${fmt(sourceTempC)}, above the boiling point: below a minimum flow the outlet boils. Keep the flow above the minimum shown, with an unvalved vent or a certified relief valve. ${DEFER}`,
  };
}

/**
 * What makes two cautions the same: the rule (code), the place (where), the threshold crossed, and
 * for a caution without a value (dead-heading) its message. A caution list keeps one entry per key,
 * so two hazards never collapse because they share a code: the pool and the outlet both over 49 °C
 * stay two cautions, as do two steps of a plan with no flow.
 */
export function cautionKey(c: Pick<Caution, 'code' | 'where' | 'thresholdC' | 'valueC' | 'message'>): string {
  return `${c.code}|${c.where}|${c.thresholdC ?? ''}${c.valueC === null ? `|${c.message}` : ''}`;
}

const RANK: Record<CautionLevel, number> = { danger: 0, warning: 1, notice: 2 };

/**
 * Merges caution lists, keeping for each {@link cautionKey} the entry with the highest value;
 * most severe first, then the highest threshold first (stable otherwise).
 * @example mergeCautions(temperatureCautions(45, 'outlet'), temperatureCautions(52, 'outlet')).map(c => c.valueC) // [52, 52]
 */
export function mergeCautions(...lists: Caution[][]): Caution[] {
  const byKey = new Map<string, Caution>();
  for (const list of lists) {
    for (const c of list) {
      const key = cautionKey(c);
      const prev = byKey.get(key);
      if (!prev || (c.valueC ?? -Infinity) > (prev.valueC ?? -Infinity)) byKey.set(key, c);
    }
  }
  return [...byKey.values()].sort((x, y) => RANK[x.level] - RANK[y.level] || (y.thresholdC ?? 0) - (x.thresholdC ?? 0));
}

/** A caution as screens and exports receive it (JSON): `where`, threshold and value may be missing. */
export interface CautionLike {
  code: string;
  level: string;
  message: string;
  where?: string;
  thresholdC?: number | null;
  valueC?: number | null;
}

/**
 * The rank of each contact band's code, most severe 0 (the order of HAZARD_BANDS): burns in
 * seconds, scald, spa limit are one hazard (how hot the water is to touch) shown at its highest
 * band. Near boiling is a hazard of its own (steam and pressure in the loop) and stays beside it:
 * water at 96 °C both flashes to steam and burns skin in seconds.
 */
const BAND_RANK = new Map<string, number>(HAZARD_BANDS.filter((b) => b.band !== 'steam').map((b, i) => [b.code, i]));

/** How {@link cautionsToShow} lists the temperature bands of one place. */
export interface CautionsToShowOptions {
  /**
   * `'all'` (default): every band reached, as exports list them for the record; `'highest'`: of
   * the bands of one place (spa limit, scald, burns in seconds, steam: {@link HAZARD_BANDS}) only
   * the most severe reached, the band {@link hazardBand} marks the value with — what screens show,
   * so a 96 °C outlet is one steam caution, not four stacked boxes.
   */
  bands?: 'all' | 'highest';
}

/**
 * The cautions to show beside a table, plot or result: each distinct caution once (by
 * {@link cautionKey}, so a shared code never hides another place or hazard), most severe first.
 * With `bands: 'highest'` a place's contact bands (burns in seconds, scald, spa limit) collapse to
 * the most severe; other cautions (near boiling, no flow, a source above boiling…) are hazards of
 * their own and are always kept.
 * @example cautionsToShow(forecast.cautions).length
 * @example cautionsToShow(temperatureCautions(62, 'outlet'), { bands: 'highest' }).map(c => c.code) // ['scald-seconds']
 */
export function cautionsToShow<T extends CautionLike>(list: readonly T[], options: CautionsToShowOptions = {}): T[] {
  const seen = new Set<string>();
  const out: T[] = [];
  const topBand = new Map<string, number>();
  if (options.bands === 'highest') {
    for (const c of list) {
      const rank = BAND_RANK.get(c.code);
      const where = c.where ?? '';
      if (rank !== undefined && rank < (topBand.get(where) ?? Infinity)) topBand.set(where, rank);
    }
  }
  for (const c of list) {
    const rank = BAND_RANK.get(c.code);
    if (rank !== undefined && rank > (topBand.get(c.where ?? '') ?? Infinity)) continue;
    const key = cautionKey({ code: c.code as CautionCode, where: c.where ?? '', thresholdC: c.thresholdC ?? null, valueC: c.valueC ?? null, message: c.message });
    if (seen.has(key)) continue;
    seen.add(key);
    out.push(c);
  }
  const rank = (l: string) => RANK[l as CautionLevel] ?? 3;
  return out.map((c, i) => ({ c, i })).sort((a, b) => rank(a.c.level) - rank(b.c.level) || (b.c.thresholdC ?? 0) - (a.c.thresholdC ?? 0) || a.i - b.i).map((x) => x.c);
}

/** One measured or predicted temperature series for {@link hottestCautions}: a place and its values, °C. */
export interface PlaceTemperatures {
  where: string;
  valuesC: Iterable<number | null | undefined>;
}

/**
 * The cautions of the hottest value of each place: one caution per hazard reached and place, most
 * severe first, for the caution list beside a table or a plot, stated in `units` first. Values
 * that are not finite are skipped (a table shows them as gaps).
 * @example hottestCautions([{ where: 'outlet', valuesC: [38, 52, 47] }]).map(c => c.code) // ['scald', 'spa-limit']
 */
export function hottestCautions(places: readonly PlaceTemperatures[], units: UnitSystem = 'si'): Caution[] {
  const lists: Caution[][] = [];
  for (const p of places) {
    let max = -Infinity;
    for (const v of p.valuesC) if (typeof v === 'number' && Number.isFinite(v) && v > max) max = v;
    if (max > -Infinity) lists.push(temperatureCautions(max, p.where, units));
  }
  return mergeCautions(...lists);
}
