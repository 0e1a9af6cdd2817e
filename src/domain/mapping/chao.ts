/**
 * Chao (1972) mapping functions, for comparison with the modern ones.
 *
 * Chao, C. C. (1972), A model for tropospheric calibration from daily surface and radiosonde balloon
 * measurements, JPL Technical Memorandum 391-350 (values from memory):
 *   m(e) = 1 / (sin e + a/(tan e + b)),
 *   dry: a = 0.00143, b = 0.0445; wet: a = 0.00035, b = 0.017.
 *
 * Valid for elevations (0°, 90°]; 1 at zenith.
 */

import type { MappingEvaluator, MappingModel } from './types.js';

export const CHAO_DRY = { a: 0.00143, b: 0.0445 } as const;
export const CHAO_WET = { a: 0.00035, b: 0.017 } as const;

/** @param elevationRad elevation [rad] @returns mapping factor [-] */
export function chaoMapping(elevationRad: number, a: number, b: number): number {
  return chaoWithSinTan(Math.sin(elevationRad), Math.tan(elevationRad), a, b);
}

/** chaoMapping() from sin e and tan e [-], for the batch loop that has them already. */
function chaoWithSinTan(sinElevation: number, tanElevation: number, a: number, b: number): number {
  return 1 / (sinElevation + a / (tanElevation + b));
}

const evaluator: MappingEvaluator = {
  hydrostatic: (e) => chaoMapping(e, CHAO_DRY.a, CHAO_DRY.b),
  wet: (e) => chaoMapping(e, CHAO_WET.a, CHAO_WET.b),
  mapBatch(elevationsRad, sinElevations, outHydrostatic, outWet) {
    for (let i = 0; i < elevationsRad.length; i++) {
      const s = sinElevations[i]!;
      const t = Math.tan(elevationsRad[i]!); // once for both factors
      outHydrostatic[i] = chaoWithSinTan(s, t, CHAO_DRY.a, CHAO_DRY.b);
      outWet[i] = chaoWithSinTan(s, t, CHAO_WET.a, CHAO_WET.b);
    }
  },
};

export const chaoModel: MappingModel = {
  key: 'chao',
  citation: 'Chao (1972)',
  requiresCoefficients: false,
  heightCorrection: () => 'none',
  prepare: () => evaluator,
};
