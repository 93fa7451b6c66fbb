/**
 * A pool or tub as people describe it — a shape and its dimensions as strings with units
 * ("18 ft", "1.2 m"), depths, and optionally a metered volume or area — read into the SI
 * `PoolDimensions` of {@link poolGeometry}. One reader for the command line and the app (run it
 * inside `readingInput`, so errors name the fields as the user wrote them).
 * @example readingInput((read) => poolGeometry(readPoolDimensions(read, { shape: 'round', diameter: '5 m', depth: '1.2 m' })))
 */
import { InputError } from '../units/reading-input';
import type { FieldReader } from '../units/read-fields';
import type { PoolDimensions, PoolShape } from './pool-geometry';

export const POOL_SHAPES = ['round', 'rectangle', 'ellipse', 'stadium', 'kidney'] as const;

/**
 * @param path where the pool sits in the input (`pool` in a forecast body; '' on the command line)
 * @throws InputError for an unknown shape; the geometry's own errors come from poolGeometry
 */
export function readPoolDimensions(read: FieldReader, input: unknown, path = ''): PoolDimensions {
  const o = read.asObject(input, path || 'input');
  const at = path ? `${path}.` : '';
  if (typeof o.shape !== 'string' || !(POOL_SHAPES as readonly string[]).includes(o.shape)) {
    throw new InputError(`${at}shape must be one of ${POOL_SHAPES.join(', ')}, got ${JSON.stringify(o.shape)}`, `${at}shape`);
  }
  const length = (key: string, as: string) => read.optionalQuantity(o, key, 'length', { path, as });
  return {
    shape: o.shape as PoolShape,
    diameterM: length('diameter', 'diameterM'),
    lengthM: length('length', 'lengthM'),
    widthM: length('width', 'widthM'),
    width2M: length('width2', 'width2M'),
    depthM: length('depth', 'depthM'),
    shallowDepthM: length('shallowDepth', 'shallowDepthM'),
    deepDepthM: length('deepDepth', 'deepDepthM'),
    enteredVolumeM3: read.optionalQuantity(o, 'volume', 'volume', { path, as: 'enteredVolumeM3' }),
    enteredAreaM2: read.optionalQuantity(o, 'area', 'area', { path, as: 'enteredAreaM2' }),
  };
}
