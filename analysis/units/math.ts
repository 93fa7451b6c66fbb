/**
 * The one mathjs instance of analysis/, with the units mathjs lacks defined from NIST SP 811
 * (2008) Appendix B.8 factors. Everything that parses or converts a quantity goes through it.
 * The exact values come from exact-factors.ts, the one table that the display edge
 * (app/_contracts/units.ts) also converts with.
 *
 * Added units (exact values as SP 811 / NIST Handbook 44 give them):
 * - `gpm` = US gallon per minute = 3.785411784 L/min (gallon = 231 in³ exactly); `gph` per hour.
 * - `lpm` = L/min; `mph` = mile per hour = 1609.344 m/h (mile exact, SP 811).
 * - `Btu` = International Table Btu = 1055.05585262 J (mathjs `BTU` is the same unit; `Btu` is the
 *   spelling practitioners type). `MBtu` = 1000 Btu, `MMBtu` = 10⁶ Btu (trade usage).
 * - `therm` = 100,000 Btu_IT = 105,505,585.262 J, the convention of US gas bills and of EIA.
 *   SP 811 also lists `thermEC` = 1.05506 × 10⁸ J (exact, EC definition) and
 *   `thermUS` = 1.054804 × 10⁸ J; both are defined here under those names.
 * - `inHg` = conventional inch of mercury, 13,595.1 kg/m³ × g_n × 0.0254 m = 3386.388640341 Pa
 *   (SP 811 prints 3.386 389 E+03).
 * - `cord` = 128 ft³ (a stacked-wood volume, US customary).
 * - `degFdiff`, `degCdiff`: temperature *intervals* (1 °F interval = 1/1.8 K).
 * - `psi` and `hp` are redefined with the exact SP 811 values (lbf/in², 550 ft·lbf/s).
 */
import { all, create, type MathJsInstance, type Unit } from 'mathjs';
import { FAHRENHEIT_PER_KELVIN, JOULES_PER_BTU, JOULES_PER_THERM, LITRES_PER_US_GALLON, METRES_PER_MILE } from './exact-factors';

export const math: MathJsInstance = create(all, {});

let defined = false;
function defineUnits(): void {
  if (defined) return;
  defined = true;
  math.createUnit({
    gpm: { definition: `${LITRES_PER_US_GALLON} L/min` },
    gph: { definition: `${LITRES_PER_US_GALLON} L/hour` },
    lpm: { definition: '1 L/min' },
    mph: { definition: `${METRES_PER_MILE} m/hour` },
    Btu: { definition: `${JOULES_PER_BTU} J`, aliases: ['btu'] },
    MBtu: { definition: `${JOULES_PER_BTU} kJ` },
    MMBtu: { definition: `${JOULES_PER_BTU} MJ` },
    therm: { definition: `${JOULES_PER_THERM} J`, aliases: ['therms', 'thm'] },
    thermEC: { definition: '105506000 J' },
    thermUS: { definition: '105480400 J' },
    cord: { definition: '128 ft^3', aliases: ['cords'] },
    inHg: { definition: '3386.388640341 Pa' },
    degFdiff: { definition: `${1 / FAHRENHEIT_PER_KELVIN} K` },
    degCdiff: { definition: '1 K' },
  });
  // mathjs's own psi and hp are a few parts in 1e11 off the exact SP 811 values; replace them.
  math.createUnit('psi', { definition: '6894.757293168361 Pa' }, { override: true });
  math.createUnit('hp', { definition: '745.69987158227022 W' }, { override: true });
}
defineUnits();

/** Parses a unit expression such as `"4.5 gpm"` or `"500 W/K"` with the shared instance. */
export function unit(text: string): Unit {
  return math.unit(text);
}
