/**
 * Cosecant mapping, m(e) = 1/sin e: the flat-atmosphere limit, for comparison only (common practice).
 * It overestimates the delay badly at low elevation (≈ 11.5 at 5° against ≈ 10.2 for Niell).
 */

import type { MappingEvaluator, MappingModel } from './types.js';

const evaluator: MappingEvaluator = {
  hydrostatic: (e) => 1 / Math.sin(e),
  wet: (e) => 1 / Math.sin(e),
  mapBatch(elevationsRad, sinElevations, outHydrostatic, outWet) {
    for (let i = 0; i < elevationsRad.length; i++) {
      const m = 1 / sinElevations[i]!;
      outHydrostatic[i] = m;
      outWet[i] = m;
    }
  },
};

export const cosecantModel: MappingModel = {
  key: 'cosecant',
  citation: 'cosecant 1/sin(e)',
  requiresCoefficients: false,
  heightCorrection: () => 'none',
  prepare: () => evaluator,
};
