/**
 * Slant delays along many directions at once:
 *
 *   slant = m_h(e) ZHD + m_w(e) ZWD + m_g(e) (G_N cos a + G_E sin a)     [m]
 *
 * (e.g. IERS Conventions (2010) eq. 9.12 with the gradient term of eq. 9.14). Inputs and outputs
 * are typed arrays so that a batch of 10^5 directions costs no allocation per direction. The mapping
 * factors come from the models' own batch loops (MappingEvaluator.mapBatch, GradientModel.mapBatch),
 * so the speed does not depend on how many models have run in the process before; sin e is computed
 * once per direction (elevationSines) and handed to both.
 */

import type { GradientModel } from './gradients/gradient-mapping.js';
import { elevationSines } from './mapping/elevation-sines.js';
import type { MappingEvaluator } from './mapping/types.js';

export interface ZenithForSlant {
  zhdM: number;
  zwdM: number;
  northGradientM: number;
  eastGradientM: number;
}

export interface SlantBatch {
  /** Work column: sin e of each direction [-], shared by the mapping and the gradient model. */
  sinElevation: Float64Array;
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
    sinElevation: new Float64Array(n),
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
  const sinElevations = elevationSines(elevationsRad, out.sinElevation);
  mapping.mapBatch(elevationsRad, sinElevations, out.mappingHydrostatic, out.mappingWet);
  gradientModel.mapBatch(elevationsRad, sinElevations, out.mappingHydrostatic, out.mappingGradient);
  // Without gradients (both +0, the default) the azimuth term is a signed zero that needs no cosine or sine.
  const noGradients = Object.is(northGradientM, 0) && Object.is(eastGradientM, 0);
  for (let i = 0; i < elevationsRad.length; i++) {
    const a = azimuthsRad[i]!;
    const hyd = out.mappingHydrostatic[i]! * zhdM;
    const wet = out.mappingWet[i]! * zwdM;
    const azimuthTerm = noGradients ? zeroGradientTerm(a) : northGradientM * Math.cos(a) + eastGradientM * Math.sin(a);
    const grad = out.mappingGradient[i]! * azimuthTerm;
    out.hydrostaticM[i] = hyd;
    out.wetM[i] = wet;
    out.gradientM[i] = grad;
    out.totalM[i] = hyd + wet + grad;
  }
  return out;
}

const TWO_PI = 2 * Math.PI;
const THREE_HALVES_PI = 1.5 * Math.PI;
/** Azimuths within this of π or 3π/2 [rad], and any outside [0, 2π), take the cosine and sine themselves. */
const QUADRANT_EDGE_RAD = 1e-6;

/**
 * 0 · cos a + 0 · sin a, exactly as computed (a signed zero: the gradient columns keep their sign bit in an
 * Arrow answer), without the two transcendental calls (a fifth of a 10 000-direction batch without gradients).
 * +0 · x is −0 exactly when x < 0 (or x is −0), and +0 + −0 is +0: the term is −0 only where both cos a < 0
 * and sin a < 0, in the third quadrant (π, 3π/2). Inside [0, 2π) and more than QUADRANT_EDGE_RAD from π and
 * 3π/2, where those two change sign, |cos a| or |sin a| that decides is above 1e-7, far beyond the error of
 * Math.cos and Math.sin, so the sign is known without them; anywhere else they are computed as written.
 *
 * @param a azimuth [rad]
 */
export function zeroGradientTerm(a: number): number {
  if (a > Math.PI + QUADRANT_EDGE_RAD && a < THREE_HALVES_PI - QUADRANT_EDGE_RAD) return -0; // cos a < 0, sin a < 0
  // sin a ≥ 0, or cos a > 0:
  if ((a >= 0 && a < Math.PI - QUADRANT_EDGE_RAD) || (a > THREE_HALVES_PI + QUADRANT_EDGE_RAD && a < TWO_PI)) return 0;
  return 0 * Math.cos(a) + 0 * Math.sin(a);
}
