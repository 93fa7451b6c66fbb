import 'server-only';
/**
 * Filling a tub in one pass through the heater (no recirculation): the fill time and final
 * temperature at the chosen flow (analysis/pool/fill-tub.ts) and the flow whose outlet gives a
 * target tub temperature (the heater's outlet against flow, `lowestFlowBelowLimit` of
 * analysis/performance/choose-flow.ts, after the mix with any water already in the tub), with the
 * cautions of the outlet and the tub (a tub above 40 °C is dangerous).
 */
import type { EntityManager } from '@mikro-orm/postgresql';
import { z } from 'zod';
import { Fit, type FitRow, type LabRow } from '@/entities';
import { fillTub } from '@/analysis/pool/fill-tub';
import { lowestFlowBelowLimit } from '@/analysis/performance/choose-flow';
import { coilHeater, type HeaterModel } from '@/analysis/performance/heater-model';
import { temperatureCautions, mergeCautions } from '@/analysis/safety/cautions';
import { parseQuantity } from '@/analysis/units/parse-quantity';
import { readingInput } from '@/analysis/units/reading-input';
import { invalid, notFound } from '../server/errors';
import { isUuid } from '../labs/load-in-lab';
import { parseStoredFit } from '../fits/stored-fit';

const q = z.string().trim().min(1).max(40);
/** What the tub-fill section posts (quantities as unit strings). */
export const tubFillInput = z.object({
  fitId: z.string().optional(),
  heater: z.object({ sourceTemp: q, UA: q }).strict().optional(),
  tubVolume: q,
  flow: q,
  supplyTemp: q,
  initialVolume: q.optional(),
  initialTemp: q.optional(),
  targetTemp: q.optional(),
}).strict();

export type TubFillInput = z.infer<typeof tubFillInput>;

/** The settings of a study's tub-fill block as stored: the page's fields without a typed heater (the block reads a saved coil fit). */
export const tubFillBlockData = tubFillInput.omit({ heater: true }).partial().strict();
export type TubFillResult = ReturnType<typeof tubFillOf>;

/** The heater of a saved coil fit of the lab (already loaded). @throws DomainError invalid (not a coil fit) */
export function tubFillHeater(fit: FitRow): { heater: HeaterModel; note: string } {
  if (fit.kind !== 'heater' || fit.model !== 'coil') throw invalid('A tub fill takes a saved coil fit (its Ts and UA give the outlet at any supply temperature).', { fitId: 'Pick a coil fit.' });
  const p = parseStoredFit(fit.result, fit.id).fit.params;
  return { heater: coilHeater({ sourceTempC: p.Ts.value, uaWPerK: p.UA.value }), note: `Heater: saved fit "${fit.title}" v${fit.version} (Ts ${p.Ts.value.toFixed(1)} °C, UA ${p.UA.value.toFixed(0)} W/K).` };
}

async function heaterOf(em: EntityManager, lab: LabRow, input: TubFillInput): Promise<{ heater: HeaterModel; note: string }> {
  if (input.fitId !== undefined) {
    const fit = isUuid(input.fitId) ? await em.findOne(Fit, { id: input.fitId, lab }) : null;
    if (!fit) throw notFound('No such saved fit in this lab.');
    return tubFillHeater(fit);
  }
  if (!input.heater) throw invalid('Give a saved coil fit or the heater’s Ts and UA.', { heater: 'a coil fit, or Ts and UA' });
  const Ts = parseQuantity(input.heater.sourceTemp, 'temperature', 'heater.sourceTemp');
  const UA = parseQuantity(input.heater.UA, 'conductance', 'heater.UA');
  if (!(UA > 0 && UA < 1e6)) throw invalid('heater.UA must be between 0 and 1,000,000 W/K.', { 'heater.UA': 'UA 0–1,000,000 W/K' });
  return { heater: coilHeater({ sourceTempC: Ts, uaWPerK: UA }), note: `Heater: Ts ${Ts.toFixed(1)} °C, UA ${UA.toFixed(0)} W/K.` };
}

/**
 * The fill at the chosen flow and, with a target, the flow that reaches it.
 * @throws DomainError invalid naming the field (bad quantities, zero flow: a dead-headed coil, out-of-range volumes)
 */
export async function tubFill(em: EntityManager, lab: LabRow, input: TubFillInput) {
  const { heater, note } = await heaterOf(em, lab, input);
  return tubFillOf(heater, note, input);
}

/**
 * A study's tub-fill block: its saved coil fit (already loaded in the lab) and its settings.
 * @throws DomainError invalid naming the field (a missing or unreadable setting, not a coil fit); InputError in the user's words
 */
export function tubFillOfFit(fit: FitRow, data: Record<string, unknown>) {
  const p = tubFillInput.safeParse({ ...data, fitId: fit.id });
  if (!p.success) {
    const i = p.error.issues[0];
    const field = i?.path.join('.') || 'settings';
    const message = i?.code === 'invalid_type' ? 'give it, with its unit' : i?.message ?? 'not valid';
    throw invalid(`${field}: ${message}`, { [field]: message });
  }
  const { heater, note } = tubFillHeater(fit);
  return readingInput(() => tubFillOf(heater, note, p.data));
}

/**
 * The fill of a heater (the page's route and a study's tub-fill block): closed forms and a
 * bisection on the outlet, cheap enough for the request thread.
 * @throws DomainError invalid naming the field
 */
export function tubFillOf(heater: HeaterModel, note: string, input: TubFillInput) {
  const V = parseQuantity(input.tubVolume, 'volume', 'tubVolume');
  const flow = parseQuantity(input.flow, 'volumeFlow', 'flow');
  const supply = parseQuantity(input.supplyTemp, 'temperature', 'supplyTemp');
  const V0 = input.initialVolume === undefined ? 0 : parseQuantity(input.initialVolume, 'volume', 'initialVolume');
  const T0 = input.initialTemp === undefined ? undefined : parseQuantity(input.initialTemp, 'temperature', 'initialTemp');
  if (!(V > 0 && V <= 100)) throw invalid('tubVolume must be more than 0 and at most 100 m³ (a tub, not a pool).', { tubVolume: 'more than 0, at most 100 m³' });
  if (!(V0 >= 0 && V0 <= 100)) throw invalid('initialVolume must be within 0–100 m³.', { initialVolume: '0–100 m³' });
  if (V0 > 0 && T0 === undefined) throw invalid('Give the temperature of the water already in the tub.', { initialTemp: 'needed with an initial volume' });
  if (!(supply > 0 && supply < 100)) throw invalid('supplyTemp must be liquid water, 0–100 °C.', { supplyTemp: '0–100 °C' });
  if (!(flow > 0)) throw invalid('flow must be more than 0: zero flow through a heated coil is a dead-headed coil (steam risk).', { flow: 'more than 0' });
  if (flow > 0.01) throw invalid('flow is over 600 L/min: check the unit.', { flow: 'at most 600 L/min' });
  const r = fillTub({ heater, tubVolumeM3: V, flowM3PerS: flow, supplyTempC: supply, initialVolumeM3: V0, initialTempC: T0 });
  let target: { targetTempC: number; outletTempC: number; flowM3PerS: number | null; fillTimeS: number | null; note: string } | null = null;
  if (input.targetTemp !== undefined) {
    const Tt = parseQuantity(input.targetTemp, 'temperature', 'targetTemp');
    // the outlet that mixes with the water already there to the target (volume-weighted, as fillTub mixes)
    const Tout = V0 > 0 ? (Tt * (V + V0) - (T0 as number) * V0) / V : Tt;
    const y = (x: number) => heater.outletTempC(x, supply);
    const f = Tout <= supply ? null : lowestFlowBelowLimit(y, 1e-6, 0.01, Tout);
    target = {
      targetTempC: Tt, outletTempC: Tout, flowM3PerS: f, fillTimeS: f ? V / f : null,
      note: Tout <= supply ? 'The target is at or below the supply: no heating is needed.' : f === null ? 'Even 600 L/min gives an outlet above the target: fill through a mixing valve, or part-fill with cold water.' : f === 0 ? 'The heater cannot reach the target at any flow from 0.06 L/min: it is too weak for this supply.' : 'The flow at which the outlet gives the target after mixing.',
    };
  }
  return { tubVolumeM3: V, flowM3PerS: flow, supplyTempC: supply, fillTimeS: r.fillTimeS, outletTempC: r.outletTempC, finalTempC: r.finalTempC, target, heaterNote: note, cautions: mergeCautions(r.cautions, target ? temperatureCautions(target.targetTempC, 'tub') : []) };
}
