/**
 * The standing safety notice, in one place for the page footer, a study's caution blocks and
 * every export (DOMAIN.md §5 "typical caution wording", our words): thresholds of
 * cautions.ts, steam in a closed coil, a relief path on any loop that can be closed, the pump
 * before the fire, carbon monoxide and GFCI, and deference to local codes.
 */
import { CAUTION_THRESHOLDS_C } from './cautions';
import { celsiusToFahrenheit } from '../units/exact-factors';

const T = CAUTION_THRESHOLDS_C;
const f = (c: number) => `${c} °C (${Math.round(celsiusToFahrenheit(c))} °F)`;

/** The notice as sentences, most important first; each stands alone. */
export const STANDING_NOTICE: readonly string[] = [
  'Emberline is an analysis aid, not a design approval: local codes, inspectors and licensed professionals have the final word.',
  `Hot water burns in seconds at ${f(T.scaldSeconds)} and above; keep water people touch below ${f(T.scald)} and spas no hotter than ${f(T.spaLimit)}. Near ${f(T.nearBoiling)} water can flash to steam when it is released.`,
  'A coil with no flow over a fire is a boiler: water in a closed coil boils, builds pressure and bursts out as steam. Fit a certified relief valve (or keep an open, unvalved vent) on any heated loop that can be closed, and never valve off a heated coil or run a pump against a closed valve.',
  'Start the pump before the fire is lit and keep it running until the coil is cold.',
  'Fuel-burning equipment makes carbon monoxide: run it outdoors, away from openings, with a CO alarm nearby. Electrical equipment near a pool needs GFCI protection.',
];

/**
 * The caution limits with their meaning and basis, for an export's Summary (DOMAIN.md §5, §3.7).
 * @example CAUTION_LIMITS[0].thresholdC // 40
 */
export const CAUTION_LIMITS: readonly { thresholdC: number; meaning: string; basis: string }[] = [
  { thresholdC: T.spaLimit, meaning: 'spa and tub limit: marked at or above', basis: 'CPSC advisory 79-071 (104 °F); UL 1563 maximum set point' },
  { thresholdC: T.scald, meaning: 'scald risk: keep water people touch below it', basis: 'published scald-time table (120 °F: more than 5 min)' },
  { thresholdC: T.scaldSeconds, meaning: 'burns skin in seconds', basis: 'published scald-time table (140 °F: less than 5 s)' },
  { thresholdC: T.nearBoiling, meaning: 'near boiling: flashes to steam when released; boils in a closed coil', basis: 'common practice' },
];
