/**
 * The unit systems a lab or a reader may choose for display. Numbers are always stored and
 * computed in SI; the choice only changes what people read (app/_contracts/units.ts).
 * This is the one declaration: entities, DTOs, pages, plots, exports and the safety words
 * (analysis/safety) import it from here.
 */

/** SI-style lab units (°C, L/min, kW, kWh) or US customary (°F, gpm, Btu/h, therm). */
export const UNIT_SYSTEMS = ['si', 'us'] as const;

/** One of UNIT_SYSTEMS. */
export type UnitSystem = (typeof UNIT_SYSTEMS)[number];
