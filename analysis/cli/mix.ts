/** `mix`: the mixed temperature of volumes of water. */
import { InputError } from './input-error';
import { mixTemperatureC } from '../pool/mixing';
import { asObject, quantity } from '../units/read-fields';
import { temperatureCautions } from '../safety/cautions';

export const help = `mixed temperature of volumes of water (volume-weighted, no losses)
input: {"parts":[{"volume":"1000 gal","temp":"100 degF"},{"volume":"9000 gal","temp":"70 degF"}]}
output: {"temp_degC", "temp_degF", "totalVolume_m3", "cautions"}`;

export function run(input: unknown): unknown {
  try {
    const o = asObject(input, 'input');
    if (!Array.isArray(o.parts) || o.parts.length === 0) throw new InputError('parts must be a non-empty array of {volume, temp}');
    const parts = o.parts.map((p, i) => {
      const q = asObject(p, `parts[${i}]`);
      const volumeM3 = quantity(q, 'volume', 'volume', `parts[${i}]`);
      if (volumeM3 < 0) throw new InputError(`parts[${i}].volume must not be negative, got ${JSON.stringify(q.volume)}`);
      return { volumeM3, tempC: quantity(q, 'temp', 'temperature', `parts[${i}]`) };
    });
    const t = mixTemperatureC(parts);
    return { temp_degC: t, temp_degF: t * 1.8 + 32, totalVolume_m3: parts.reduce((s, p) => s + p.volumeM3, 0), cautions: temperatureCautions(t, 'mixed water') };
  } catch (e) {
    if (e instanceof TypeError || e instanceof RangeError) throw new InputError(e.message);
    throw e;
  }
}
