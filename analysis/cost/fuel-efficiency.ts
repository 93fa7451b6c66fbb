/**
 * Thermal efficiency against fuel energy (DOMAIN.md §1.7): η = Q_delivered / E_fuel with
 * E_fuel = quantity × heating value. The basis (HHV gross or LHV net) is always stated, and the
 * other basis is given when the fuel's gross/net ratio is known (η_LHV = η_HHV × HHV/LHV).
 */
import { requirePositive, requireNonNegative } from '../units/guards';

/** Efficiency on both bases. */
export interface FuelEfficiency {
  efficiency: number;
  basis: 'HHV' | 'LHV';
  /** the same result on the other basis, when the gross/net ratio is known */
  other: { basis: 'HHV' | 'LHV'; efficiency: number } | null;
  fuelEnergyJ: number;
  /** true when the delivered energy exceeds the fuel energy (a measurement or input error) */
  exceedsFuelEnergy: boolean;
}

/**
 * @param deliveredJ energy delivered to the water, J (Σ q_i Δt_i)
 * @param fuelQuantity amount of fuel burned, in the unit of `heatingValueJPerUnit`
 * @param heatingValueJPerUnit heating value per unit of fuel, J
 * @param basis which heating value that is
 * @param grossToNet HHV/LHV of the fuel (1.105 natural gas, 1.088 propane), when known
 * @throws RangeError for non-positive fuel quantity or heating value, negative delivered energy.
 * @example fuelEfficiency(300e6, 10, 50e6, 'HHV').efficiency // 0.6
 */
export function fuelEfficiency(
  deliveredJ: number, fuelQuantity: number, heatingValueJPerUnit: number, basis: 'HHV' | 'LHV', grossToNet?: number,
): FuelEfficiency {
  const q = requireNonNegative(deliveredJ, 'deliveredJ');
  const e = requirePositive(fuelQuantity, 'fuelQuantity') * requirePositive(heatingValueJPerUnit, 'heatingValueJPerUnit');
  if (basis !== 'HHV' && basis !== 'LHV') throw new RangeError(`basis must be HHV or LHV, got ${JSON.stringify(basis)}`);
  const eta = q / e;
  let other: FuelEfficiency['other'] = null;
  if (grossToNet !== undefined) {
    const r = requirePositive(grossToNet, 'grossToNet');
    other = basis === 'HHV' ? { basis: 'LHV', efficiency: eta * r } : { basis: 'HHV', efficiency: eta / r };
  }
  return { efficiency: eta, basis, other, fuelEnergyJ: e, exceedsFuelEnergy: eta > 1 };
}
