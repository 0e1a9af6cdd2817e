/**
 * Slant delays along many directions at once:
 *
 *   slant = m_h(e) ZHD + m_w(e) ZWD + m_g(e) (G_N cos a + G_E sin a)     [m]
 *
 * (e.g. IERS Conventions (2010) eq. 9.12 with the gradient term of eq. 9.14). Inputs and outputs
 * are typed arrays so that a batch of 10^5 directions costs no allocation per direction. The mapping
 * factors come from the models' own batch loops (MappingEvaluator.mapBatch, GradientModel.mapBatch),
 * so the speed does not depend on how many models have run in the process before.
 */

import type { GradientModel } from './gradients/gradient-mapping.js';
import type { MappingEvaluator } from './mapping/types.js';

export interface ZenithForSlant {
  zhdM: number;
  zwdM: number;
  northGradientM: number;
  eastGradientM: number;
}

export interface SlantBatch {
  mappingHydrostatic: Float64Array;
  mappingWet: Float64Array;
  mappingGradient: Float64Array;
  hydrostaticM: Float64Array;
  wetM: Float64Array;
  gradientM: Float64Array;
  totalM: Float64Array;
}

export function allocateSlantBatch(n: number): SlantBatch {
  return {
    mappingHydrostatic: new Float64Array(n),
    mappingWet: new Float64Array(n),
    mappingGradient: new Float64Array(n),
    hydrostaticM: new Float64Array(n),
    wetM: new Float64Array(n),
    gradientM: new Float64Array(n),
    totalM: new Float64Array(n),
  };
}

/**
 * @param mapping mapping function prepared for the site and epoch
 * @param gradientModel gradient mapping model
 * @param zenith zenith delays and gradients [m]
 * @param elevationsRad vacuum elevations [rad], (0, π/2]
 * @param azimuthsRad azimuths from north through east [rad]
 * @param out preallocated result arrays of the same length
 */
export function computeSlantDelays(
  mapping: MappingEvaluator,
  gradientModel: GradientModel,
  zenith: ZenithForSlant,
  elevationsRad: ArrayLike<number>,
  azimuthsRad: ArrayLike<number>,
  out: SlantBatch,
): SlantBatch {
  const { zhdM, zwdM, northGradientM, eastGradientM } = zenith;
  mapping.mapBatch(elevationsRad, out.mappingHydrostatic, out.mappingWet);
  gradientModel.mapBatch(elevationsRad, out.mappingHydrostatic, out.mappingGradient);
  for (let i = 0; i < elevationsRad.length; i++) {
    const a = azimuthsRad[i]!;
    const hyd = out.mappingHydrostatic[i]! * zhdM;
    const wet = out.mappingWet[i]! * zwdM;
    const grad = out.mappingGradient[i]! * (northGradientM * Math.cos(a) + eastGradientM * Math.sin(a));
    out.hydrostaticM[i] = hyd;
    out.wetM[i] = wet;
    out.gradientM[i] = grad;
    out.totalM[i] = hyd + wet + grad;
  }
  return out;
}
