/**
 * Simple payback of a heater against another: extra capital cost / annual running-cost saving,
 * with the annual useful heat the same for both. Also the capital cost per useful therm over an
 * assumed life (our structure, DOMAIN.md §6).
 */
import { requireNonNegative, requirePositive } from '../units/guards';
import { USEFUL_THERM_J } from './useful-heat-cost';

/** Payback result. */
export interface Payback {
  annualCostThis: number;
  annualCostOther: number;
  annualSaving: number;
  /** years; null when this heater does not save money (it never pays back) */
  years: number | null;
  /** capital per useful therm over the life, when a life is given */
  capitalPerUsefulTherm: number | null;
}

/**
 * @param o.capitalCost cost of this heater (or the extra cost over the other)
 * @param o.annualUsefulHeatJ heat delivered per year, J
 * @param o.perUsefulThermThis / perUsefulThermOther running cost per useful therm
 * @param o.lifeYears assumed life for the capital-per-therm figure
 * @throws RangeError for negative costs or non-positive heat or life.
 * @example payback({ capitalCost: 800, annualUsefulHeatJ: 400 * 105.5e6, perUsefulThermThis: 0.9, perUsefulThermOther: 2.5 }).years // ≈ 1.25
 */
export function payback(o: {
  capitalCost: number; annualUsefulHeatJ: number; perUsefulThermThis: number; perUsefulThermOther: number; lifeYears?: number;
}): Payback {
  const cap = requireNonNegative(o.capitalCost, 'capitalCost');
  const therms = requirePositive(o.annualUsefulHeatJ, 'annualUsefulHeatJ') / USEFUL_THERM_J;
  const a = therms * requireNonNegative(o.perUsefulThermThis, 'perUsefulThermThis');
  const b = therms * requireNonNegative(o.perUsefulThermOther, 'perUsefulThermOther');
  const saving = b - a;
  const life = o.lifeYears === undefined ? null : requirePositive(o.lifeYears, 'lifeYears');
  return {
    annualCostThis: a, annualCostOther: b, annualSaving: saving,
    years: saving > 0 ? cap / saving : null,
    capitalPerUsefulTherm: life === null ? null : cap / (therms * life),
  };
}
