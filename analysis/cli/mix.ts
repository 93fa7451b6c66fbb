/** `mix`: the mixed temperature of volumes of water. */
import { InputError, readingInput } from '../units/reading-input';
import { mixTemperatureC, volumeWeightedTempC } from '../pool/mixing';
import { waterDensityKgPerM3 } from '../water/water-properties';
import { temperatureCautions } from '../safety/cautions';

export const help = `mixed temperature of volumes of water (by mass and enthalpy, IAPWS-IF97 at 1 atm, no losses)
input: {"parts":[{"volume":"1000 gal","temp":"100 degF"},{"volume":"9000 gal","temp":"70 degF"}]}
  each volume as measured at its own temperature; temperatures 0-100 degC (liquid water at 1 atm)
output: {"temp_degC", "temp_degF", "totalVolume_m3", "totalMass_kg", "method",
         "volumeWeighted": {"temp_degC", "temp_degF", "note"}, "cautions"}
  volumeWeighted is the trade's rule of thumb (density and cp changes neglected), for comparison only`;

export function run(input: unknown): unknown {
  return readingInput((read) => {
    const o = read.asObject(input, 'input');
    if (!Array.isArray(o.parts) || o.parts.length === 0) throw new InputError('parts must be a non-empty array of {volume, temp}');
    const parts = o.parts.map((p, i) => {
      const q = read.asObject(p, `parts[${i}]`);
      const volumeM3 = read.quantity(q, 'volume', 'volume', { path: `parts[${i}]`, as: `parts[${i}].volumeM3` });
      if (volumeM3 < 0) throw new InputError(`parts[${i}].volume must not be negative, got ${JSON.stringify(q.volume)}`);
      return { volumeM3, tempC: read.quantity(q, 'temp', 'temperature', { path: `parts[${i}]`, as: `parts[${i}].tempC` }) };
    });
    const t = mixTemperatureC(parts);
    const tv = volumeWeightedTempC(parts);
    return {
      temp_degC: t, temp_degF: t * 1.8 + 32, totalVolume_m3: parts.reduce((s, p) => s + p.volumeM3, 0),
      totalMass_kg: parts.reduce((s, p) => s + p.volumeM3 * waterDensityKgPerM3(p.tempC), 0),
      method: 'mass and enthalpy (IAPWS-IF97 at 1 atm)',
      volumeWeighted: { temp_degC: tv, temp_degF: tv * 1.8 + 32, note: 'rule of thumb: volume-weighted, density and cp changes neglected; for comparison only' },
      cautions: temperatureCautions(t, 'mixed water'),
    };
  });
}
