/**
 * The exact definitions behind every non-SI unit the workbench shows or reads, as plain numbers
 * (NIST SP 811 (2008) Appendix B.8 and B.9; NIST Handbook 44 Appendix C). This is the one table:
 * the mathjs instance (math.ts) defines its added units from it, and the display edge
 * (app/_contracts/units.ts) converts with it, so the browser gets the factors without loading
 * mathjs (about 190 KB gzipped). test/analysis/units checks each value against the SP 811
 * reference file and against mathjs's own built-in units.
 */

/** 1 US gallon = 231 in³ = 3.785411784 L exactly (SP 811 B.8, Handbook 44 C). */
export const LITRES_PER_US_GALLON = 3.785411784;
/** 1 ft = 0.3048 m exactly (SP 811 B.8). */
export const METRES_PER_FOOT = 0.3048;
/** 1 mile = 1609.344 m exactly (SP 811 B.8). */
export const METRES_PER_MILE = 1609.344;
/** 1 lb (avoirdupois) = 0.45359237 kg exactly (SP 811 B.8). */
export const KILOGRAMS_PER_POUND = 0.45359237;
/** 1 Btu (International Table) = 1055.05585262 J exactly (SP 811 B.8). */
export const JOULES_PER_BTU = 1055.05585262;
/** 1 therm = 100,000 Btu_IT = 105,505,585.262 J (the convention of US gas bills and of EIA). */
export const JOULES_PER_THERM = 105505585.262;
/** 1 kWh = 3.6 MJ exactly (SP 811 B.8). */
export const JOULES_PER_KILOWATT_HOUR = 3.6e6;
/** 1 h = 3600 s, 1 min = 60 s. */
export const SECONDS_PER_HOUR = 3600;
export const SECONDS_PER_MINUTE = 60;
/** A temperature interval: 1 K = 1.8 °F exactly (SP 811 B.9). */
export const FAHRENHEIT_PER_KELVIN = 1.8;
/** t/°F = 1.8 · t/°C + 32 exactly (SP 811 B.9). */
export const FAHRENHEIT_AT_0_CELSIUS = 32;

/**
 * A temperature in °F from °C (SP 811 B.9: t/°F = 1.8 · t/°C + 32).
 * @example celsiusToFahrenheit(60) // 140
 */
export function celsiusToFahrenheit(tempC: number): number {
  return tempC * FAHRENHEIT_PER_KELVIN + FAHRENHEIT_AT_0_CELSIUS;
}

/**
 * A temperature in °C from °F (SP 811 B.9).
 * @example fahrenheitToCelsius(140) // 60
 */
export function fahrenheitToCelsius(tempF: number): number {
  return (tempF - FAHRENHEIT_AT_0_CELSIUS) / FAHRENHEIT_PER_KELVIN;
}
