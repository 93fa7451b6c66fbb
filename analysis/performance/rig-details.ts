/**
 * The construction details of a rig under test (a coil or a collector), SI, as stored in
 * `rig.details` (JSON) and as they cross to the browser: declared once here, the one place both
 * the entity (entities/rig.ts) and the contract (app/_contracts/dto.ts) can import. The API's
 * bounded schema of them is `rigFields` in app/_lib/rigs/rigs.ts. Types only.
 */
export interface RigDetails {
  coilLengthM?: number;
  tubeInnerDiameterM?: number;
  tubeMaterial?: string;
  collectorAreaM2?: number;
  /** propane and gas burners: the rated input, W */
  burnerRatingW?: number;
  /** solar collectors (app/_lib/rigs/rigs.ts `collectorDetails`): areas m², tilt and azimuth in degrees, the fluid, flow per gross area m³/(s·m²) */
  grossAreaM2?: number;
  apertureAreaM2?: number;
  tiltDeg?: number;
  azimuthDeg?: number;
  fluid?: string;
  fluidCpJPerKgK?: number;
  fluidDensityKgPerM3?: number;
  flowPerAreaM3PerSM2?: number;
  /** what the rig cost to build, in `buildCostCurrency` (a code such as "USD") */
  buildCost?: number;
  buildCostCurrency?: string;
  [key: string]: unknown;
}
