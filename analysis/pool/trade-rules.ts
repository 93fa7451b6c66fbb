/**
 * Pool-trade rules of thumb, reproduced for comparison with the physics (DOMAIN.md §3.1, §3.2,
 * §3.5). They work in feet, gallons, °F and Btu because that is how the trade states them.
 */
import { requireFinite, requirePositive } from '../units/guards';
import { convert } from '../units/parse-quantity';
import type { PoolShape } from './pool-geometry';

/** Gallons per (ft of each plan dimension × ft of depth) used by pool stores, per shape. */
export const TRADE_VOLUME_FACTORS: Record<Exclude<PoolShape, 'stadium'>, number> = {
  rectangle: 7.5,
  round: 5.9,
  ellipse: 5.9,
  kidney: 0.45 * 7.5,
};

/**
 * Trade-rule volume in US gallons: rectangle L·W·d·7.5, round D²·d·5.9, oval L·W·d·5.9,
 * kidney (A + B)·L·0.45·d·7.5 (dimensions in feet).
 * @param shape pool shape (no rule exists for a stadium)
 * @param dimsFt [L, W] (rectangle/ellipse), [D] (round), [A, B, L] (kidney), feet
 * @param depthFt average water depth, ft
 * @throws RangeError for a stadium or wrong number of dimensions.
 * @example tradeRuleGallons('round', [18], 4) // 7646.4
 */
export function tradeRuleGallons(shape: PoolShape, dimsFt: number[], depthFt: number): number {
  const d = requirePositive(depthFt, 'depthFt');
  dimsFt.forEach((x, i) => requirePositive(x, `dimsFt[${i}]`));
  switch (shape) {
    case 'round':
      if (dimsFt.length !== 1) throw new RangeError('round takes one dimension (diameter)');
      return dimsFt[0] ** 2 * d * 5.9;
    case 'rectangle':
    case 'ellipse':
      if (dimsFt.length !== 2) throw new RangeError(`${shape} takes two dimensions (length, width)`);
      return dimsFt[0] * dimsFt[1] * d * TRADE_VOLUME_FACTORS[shape];
    case 'kidney':
      if (dimsFt.length !== 3) throw new RangeError('kidney takes three dimensions (width A, width B, length)');
      return (dimsFt[0] + dimsFt[1]) * dimsFt[2] * 0.45 * d * 7.5;
    default:
      throw new RangeError(`no trade volume rule for shape ${JSON.stringify(shape)}`);
  }
}

/** The trade's 8.33 Btu per gallon per °F (8.33 lb/gal × 1 Btu/(lb·°F)). */
export const TRADE_BTU_PER_GAL_PER_DEGF = 8.33;

/**
 * The hydronic "500 rule": q [Btu/h] ≈ 500 × gpm × ΔT[°F] (485 for antifreeze mixes).
 * @example fiveHundredRuleBtuPerH(5, 15) // 37500
 */
export function fiveHundredRuleBtuPerH(gpm: number, deltaTF: number, factor = 500): number {
  return requireFinite(factor, 'factor') * requireFinite(gpm, 'gpm') * requireFinite(deltaTF, 'deltaTF');
}

/**
 * DOE sizing rule for an outdoor pool gas heater: output Btu/h = area ft² × (desired water °F −
 * coldest-month mean air °F) × 12. Takes SI and returns both units.
 * @param areaM2 pool surface, m²
 * @param targetC desired water temperature, °C
 * @param coldestAirC average air temperature of the coldest month of use, °C
 * @throws RangeError when the target is not above the air temperature.
 * @example doeHeaterSizing(50, 27, 15).outputBtuPerH // ≈ 139,500 (538 ft², ΔT 21.6 °F)
 */
export function doeHeaterSizing(areaM2: number, targetC: number, coldestAirC: number): { outputBtuPerH: number; outputW: number } {
  const ft2 = convert(requirePositive(areaM2, 'areaM2'), 'm^2', 'ft^2');
  const dF = (requireFinite(targetC, 'targetC') - requireFinite(coldestAirC, 'coldestAirC')) * 1.8;
  if (!(dF > 0)) throw new RangeError(`targetC (${targetC}) must be above coldestAirC (${coldestAirC})`);
  const btuh = ft2 * dF * 12;
  return { outputBtuPerH: btuh, outputW: convert(btuh, 'Btu/h', 'W') };
}
