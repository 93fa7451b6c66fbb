/**
 * Structured safety cautions that travel with every predicted or measured water temperature.
 * Thresholds follow DOMAIN.md §5 and §3.7: 40 °C spa limit (CPSC advisory, UL 1563), 49 °C scald
 * caution and 60 °C "burns in seconds" (scald-time tables after Henriques & Moritz), 95 °C near
 * boiling with a steam risk. Scald cautions also state the time to a serious scald at the
 * temperature (scald-time.ts, DOMAIN.md §5 [39]). Wording is Emberline's own and defers to local codes.
 */
import { scaldTime } from './scald-time';

/** How serious a caution is: `notice` < `warning` < `danger`. */
export type CautionLevel = 'notice' | 'warning' | 'danger';

/** Which rule raised the caution. */
export type CautionCode =
  | 'spa-limit'
  | 'scald'
  | 'scald-seconds'
  | 'near-boiling'
  | 'dead-heading'
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

const DEFER = 'This is an analysis aid, not a design approval: follow local codes and licensed practice.';

function fmt(c: number): string {
  return `${c.toFixed(1)} °C (${(c * 1.8 + 32).toFixed(0)} °F)`;
}

function exposure(c: number): string {
  const t = scaldTime(c).text.replace(/^longer than/, 'more than').replace(/^shorter than/, 'less than');
  return `At this temperature a serious scald takes ${t} of contact (published scald-time table), and less for children and older people.`;
}

/**
 * Cautions for a water temperature that people may touch or that sits in a heater. Returns one
 * entry per threshold crossed (strictly above), most severe first; an empty array below 40 °C.
 * The `scald` and `scald-seconds` messages include the time to a serious scald (scald-time.ts).
 * @param tempC the predicted or measured temperature, °C
 * @param where what the temperature is, e.g. 'outlet', 'pool', 'tub'
 * @throws TypeError when `tempC` is not a finite number.
 * @example temperatureCautions(62, 'outlet').map(c => c.code) // ['scald-seconds', 'scald', 'spa-limit']
 */
export function temperatureCautions(tempC: number, where: string): Caution[] {
  if (typeof tempC !== 'number' || !Number.isFinite(tempC)) {
    throw new TypeError(`tempC must be a finite number, got ${String(tempC)}`);
  }
  const out: Caution[] = [];
  const T = CAUTION_THRESHOLDS_C;
  if (tempC > T.nearBoiling) {
    out.push({
      code: 'near-boiling', level: 'danger', thresholdC: T.nearBoiling, valueC: tempC, where,
      message: `The ${where} water reaches ${fmt(tempC)}, close to boiling: it can flash to steam where pressure drops. Keep an open vent or a certified relief valve, raise the flow, and never valve off a heated coil. ${DEFER}`,
    });
  }
  if (tempC > T.scaldSeconds) {
    out.push({
      code: 'scald-seconds', level: 'danger', thresholdC: T.scaldSeconds, valueC: tempC, where,
      message: `The ${where} water reaches ${fmt(tempC)}: above 60 °C (140 °F) water burns skin in seconds. ${exposure(tempC)} Keep it away from anyone's reach. ${DEFER}`,
    });
  }
  if (tempC > T.scald) {
    out.push({
      code: 'scald', level: 'warning', thresholdC: T.scald, valueC: tempC, where,
      message: `The ${where} water reaches ${fmt(tempC)}: above 49 °C (120 °F) water can scald; keep water people touch below it. ${exposure(tempC)} ${DEFER}`,
    });
  }
  if (tempC > T.spaLimit) {
    out.push({
      code: 'spa-limit', level: 'warning', thresholdC: T.spaLimit, valueC: tempC, where,
      message: `The ${where} water reaches ${fmt(tempC)}, above the 40 °C (104 °F) limit commonly set for spas and tubs; fit a high-limit cut-out and check the water with an accurate thermometer. ${DEFER}`,
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
    message: `${where}: no water flows through a heated coil. A coil with no flow over a fire or burner is a boiler: the water can boil, build pressure and flash to steam, and a pump run against a closed valve heats its own water until it boils. Start the flow before lighting, keep it until the coil is cold, and keep an unvalved vent or a certified relief valve. ${DEFER}`,
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
 * Merges caution lists, keeping for each (code, where) the entry with the highest value.
 * @example mergeCautions([a], [b])
 */
export function mergeCautions(...lists: Caution[][]): Caution[] {
  const byKey = new Map<string, Caution>();
  for (const list of lists) {
    for (const c of list) {
      const key = `${c.code}|${c.where}`;
      const prev = byKey.get(key);
      if (!prev || (c.valueC ?? -Infinity) > (prev.valueC ?? -Infinity)) byKey.set(key, c);
    }
  }
  const rank: Record<CautionLevel, number> = { danger: 0, warning: 1, notice: 2 };
  return [...byKey.values()].sort((x, y) => rank[x.level] - rank[y.level] || (y.thresholdC ?? 0) - (x.thresholdC ?? 0));
}
