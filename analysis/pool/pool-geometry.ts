/**
 * Water volume and surface area of pools and tubs from dimensions and water depth
 * (DOMAIN.md §3.1). Exact geometry for round, rectangle, ellipse and stadium (a rectangle with
 * two semicircular ends); the kidney shape has no exact formula and uses the pool-trade area
 * rule A = 0.45·(A + B)·L (A, B = the two widths). Depth is uniform, or the mean of a shallow and
 * a deep end (right only for one uniform slope). A volume measured by meter may be entered
 * instead, with the surface area computed from the plan shape or entered too.
 */
import { requirePositive } from '../units/guards';

export type PoolShape = 'round' | 'rectangle' | 'ellipse' | 'stadium' | 'kidney';

/** Plan and depth of a pool or tub, metres. */
export interface PoolDimensions {
  shape: PoolShape;
  /** round: diameter, m */
  diameterM?: number;
  /** rectangle/ellipse/stadium/kidney: overall length, m */
  lengthM?: number;
  /** rectangle/ellipse/stadium: overall width, m; kidney: the first width */
  widthM?: number;
  /** kidney: the second width, m */
  width2M?: number;
  /** uniform water depth, m (not wall height) */
  depthM?: number;
  /** shallow-end and deep-end water depths, m (instead of depthM) */
  shallowDepthM?: number;
  deepDepthM?: number;
  /** a volume measured by meter, m³; replaces the computed volume */
  enteredVolumeM3?: number;
  /** an entered surface area, m²; replaces the computed area */
  enteredAreaM2?: number;
}

/** Geometry result. */
export interface PoolGeometry {
  volumeM3: number;
  areaM2: number;
  meanDepthM: number;
  /** 'exact' geometry, 'trade rule' (kidney area), or 'entered' (meter reading) */
  volumeMethod: 'exact' | 'trade rule' | 'entered';
  notes: string[];
}

/**
 * Surface (plan) area of the pool shape, m².
 * @throws TypeError / RangeError naming the missing or non-positive dimension.
 * @example planAreaM2({ shape: 'round', diameterM: 5 }) // 19.635 m²
 */
export function planAreaM2(d: PoolDimensions): number {
  switch (d.shape) {
    case 'round': {
      const D = requirePositive(d.diameterM, 'diameterM');
      return (Math.PI / 4) * D * D;
    }
    case 'rectangle':
      return requirePositive(d.lengthM, 'lengthM') * requirePositive(d.widthM, 'widthM');
    case 'ellipse':
      return (Math.PI / 4) * requirePositive(d.lengthM, 'lengthM') * requirePositive(d.widthM, 'widthM');
    case 'stadium': {
      const L = requirePositive(d.lengthM, 'lengthM');
      const W = requirePositive(d.widthM, 'widthM');
      if (W > L) throw new RangeError(`widthM (${W}) must not exceed lengthM (${L}) for a stadium shape`);
      return (L - W) * W + (Math.PI / 4) * W * W;
    }
    case 'kidney':
      return 0.45 * (requirePositive(d.widthM, 'widthM') + requirePositive(d.width2M, 'width2M')) * requirePositive(d.lengthM, 'lengthM');
    default:
      throw new RangeError(`shape must be round, rectangle, ellipse, stadium or kidney, got ${JSON.stringify((d as { shape: unknown }).shape)}`);
  }
}

/**
 * Mean water depth from a uniform depth or a shallow/deep pair, m.
 * @throws RangeError when neither or both forms are given, or a depth is not positive.
 * @example meanDepthM({ shape: 'rectangle', shallowDepthM: 1, deepDepthM: 2 }) // 1.5
 */
export function meanDepthM(d: PoolDimensions): number {
  const uniform = d.depthM !== undefined;
  const pair = d.shallowDepthM !== undefined || d.deepDepthM !== undefined;
  if (uniform === pair) throw new RangeError('give either depthM or both shallowDepthM and deepDepthM');
  if (uniform) return requirePositive(d.depthM, 'depthM');
  const s = requirePositive(d.shallowDepthM, 'shallowDepthM');
  const deep = requirePositive(d.deepDepthM, 'deepDepthM');
  if (deep < s) throw new RangeError(`deepDepthM (${deep}) must not be less than shallowDepthM (${s})`);
  return (s + deep) / 2;
}

/**
 * Volume and surface area of a pool.
 * @throws TypeError / RangeError naming the field (missing, negative or zero dimensions,
 *   unknown shape, negative entered volume).
 * @example poolGeometry({ shape: 'round', diameterM: 5, depthM: 1.2 }).volumeM3 // 23.562 m³
 */
export function poolGeometry(d: PoolDimensions): PoolGeometry {
  const notes: string[] = [];
  const area = d.enteredAreaM2 !== undefined ? requirePositive(d.enteredAreaM2, 'enteredAreaM2') : planAreaM2(d);
  if (d.enteredVolumeM3 !== undefined) {
    const v = requirePositive(d.enteredVolumeM3, 'enteredVolumeM3');
    notes.push('Volume as entered (meter reading); mean depth derived from it.');
    return { volumeM3: v, areaM2: area, meanDepthM: v / area, volumeMethod: 'entered', notes };
  }
  const depth = meanDepthM(d);
  if (d.shallowDepthM !== undefined) {
    notes.push('Mean of shallow and deep depths: right for one uniform slope only; sum sections for hopper or sport bottoms.');
  }
  if (d.shape === 'kidney') notes.push('Kidney area from the trade rule 0.45·(A + B)·L; enter a metered volume when you have one.');
  if (d.shape === 'ellipse') notes.push('Many above-ground "oval" pools are stadium-shaped (straight sides); choose stadium if yours is.');
  return { volumeM3: area * depth, areaM2: area, meanDepthM: depth, volumeMethod: d.shape === 'kidney' ? 'trade rule' : 'exact', notes };
}
