/**
 * A build-cost sheet: items by sub-assembly (coil and tubing, fittings, pump, valves and relief
 * devices, sensors and logger, burner or firebox, safety devices, labour…), quantity and unit
 * cost, with a sales-tax rate on taxable items. Money is summed in integer cents, each line
 * rounded half away from zero, so totals add up exactly as printed.
 */
import { requireFinite, requireInRange, requireNonNegative } from '../units/guards';

/** One line of the sheet. */
export interface BuildItem {
  subassembly: string;
  description: string;
  quantity: number;
  unitCost: number;
  /** default true; labour is often not taxed */
  taxable?: boolean;
}

/** The totalled sheet, in currency units (already rounded to cents). */
export interface BuildCostSheet {
  lines: { subassembly: string; description: string; quantity: number; unitCost: number; extended: number; taxable: boolean }[];
  subtotals: { subassembly: string; subtotal: number }[];
  subtotal: number;
  tax: number;
  total: number;
}

function cents(x: number): number {
  // toPrecision(12) removes binary noise such as 59.97000000000001 before rounding
  const v = Number((x * 100).toPrecision(12));
  return Math.sign(v) * Math.round(Math.abs(v));
}

/**
 * @param items the lines
 * @param taxRate sales-tax rate as a fraction, 0–1 (0.0825 for 8.25 %)
 * @throws TypeError / RangeError naming the line and field for negative quantities or costs.
 * @example buildCostSheet([{ subassembly: 'coil', description: 'copper tube', quantity: 2, unitCost: 48.5 }], 0.08).total // 104.76
 */
export function buildCostSheet(items: BuildItem[], taxRate: number): BuildCostSheet {
  if (!Array.isArray(items)) throw new TypeError('items must be an array');
  const rate = requireInRange(taxRate, 'taxRate', 0, 1);
  const order: string[] = [];
  const sub = new Map<string, number>();
  let taxableCents = 0, totalCents = 0;
  const lines = items.map((it, i) => {
    if (typeof it?.subassembly !== 'string' || it.subassembly.trim() === '') throw new TypeError(`items[${i}].subassembly must be a name`);
    const q = requireNonNegative(it.quantity, `items[${i}].quantity`);
    const u = requireNonNegative(requireFinite(it.unitCost, `items[${i}].unitCost`), `items[${i}].unitCost`);
    const ext = cents(q * u);
    const taxable = it.taxable !== false;
    if (!sub.has(it.subassembly)) { order.push(it.subassembly); sub.set(it.subassembly, 0); }
    sub.set(it.subassembly, (sub.get(it.subassembly) as number) + ext);
    totalCents += ext;
    if (taxable) taxableCents += ext;
    return { subassembly: it.subassembly, description: String(it.description ?? ''), quantity: q, unitCost: u, extended: ext / 100, taxable };
  });
  const taxCents = cents((taxableCents / 100) * rate);
  return {
    lines,
    subtotals: order.map((s) => ({ subassembly: s, subtotal: (sub.get(s) as number) / 100 })),
    subtotal: totalCents / 100, tax: taxCents / 100, total: (totalCents + taxCents) / 100,
  };
}
