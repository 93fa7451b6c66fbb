/** `volume`: water volume and surface area of a pool or tub from dimensions with units. */
import { readingInput } from '../units/reading-input';
import { poolGeometry } from '../pool/pool-geometry';
import { readPoolDimensions } from '../pool/read-pool-dimensions';
import { convert } from '../units/parse-quantity';
import { energyPerDegreeJPerK } from '../pool/energy-per-degree';

export const help = `pool or tub volume and surface area from dimensions
input: {"shape":"round","diameter":"18 ft","depth":"4 ft"}
  shape: round (diameter) | rectangle | ellipse | stadium (length, width) | kidney (length, width, width2)
  depth, or shallowDepth + deepDepth (water depth, not wall height); optional volume (metered) and area
output: {"volume_m3", "area_m2", "volume_gal", "area_ft2", "meanDepth_m", "energyPerDegree_J_per_K", "method", "notes"}`;

export function run(input: unknown): unknown {
  return readingInput((read) => {
    const o = read.asObject(input, 'input');
    const g = poolGeometry(readPoolDimensions(read, o));
    return {
      volume_m3: g.volumeM3, area_m2: g.areaM2, volume_gal: convert(g.volumeM3, 'm^3', 'gal'), area_ft2: convert(g.areaM2, 'm^2', 'ft^2'),
      meanDepth_m: g.meanDepthM, energyPerDegree_J_per_K: energyPerDegreeJPerK(g.volumeM3), method: g.volumeMethod, notes: g.notes,
    };
  });
}
