/**
 * Gradient mapping functions: the factor that multiplies G_N cos a + G_E sin a in the slant delay.
 *
 * "chen-herring" (default): Chen & Herring (1997), J. Geophys. Res. 102(B9), 20489–20502, eq. 8:
 *     m_g(e) = 1 / (sin e tan e + C),  C = 0.0032   (the value of IERS Conventions (2010) ch. 9,
 *     from memory; Chen & Herring also give 0.0031 hydrostatic, 0.0007 wet).
 * "tilting": the tilted-atmosphere form m_g(e) = m_h(e) cot e with the hydrostatic mapping function
 *     of the chosen model; MacMillan (1995), Geophys. Res. Lett. 22, 1041–1044; Bar-Sever et al.
 *     (1998), J. Geophys. Res. 103, 5019–5035 (from memory).
 *
 * Valid for elevations (0°, 90°]; both vanish at zenith, where they return exactly 0 (in floating
 * point tan(π/2) is 1.6e16, not infinite, and the formulas would give 6e-17). Gradients G_N, G_E in [m].
 */

import type { MappingEvaluator } from '../mapping/types.js';

export const CHEN_HERRING_C = 0.0032;

export type GradientMapping = (elevationRad: number) => number;

/** The zenith [rad]: 90 · (π/180) is exactly π/2 in floating point. */
const ZENITH_RAD = Math.PI / 2;

/** @param elevationRad elevation [rad], (0, π/2] @returns gradient mapping factor [-], 0 at the zenith */
export function chenHerringGradientMapping(elevationRad: number): number {
  if (elevationRad >= ZENITH_RAD) return 0;
  return 1 / (Math.sin(elevationRad) * Math.tan(elevationRad) + CHEN_HERRING_C);
}

export interface GradientModel {
  key: string;
  citation: string;
  prepare(mapping: MappingEvaluator): GradientMapping;
  /**
   * The factor for a batch, out[i] at elevationsRad[i] [rad], given the hydrostatic mapping factors of
   * the same elevations (the tilted form needs them) and sinElevations[i] = Math.sin(elevationsRad[i]) [-]
   * (elevationSines()); one loop per model, like MappingEvaluator.mapBatch.
   */
  mapBatch(elevationsRad: ArrayLike<number>, sinElevations: Float64Array, hydrostatic: Float64Array, out: Float64Array): void;
}

export const GRADIENT_MODELS: Record<string, GradientModel> = {
  'chen-herring': {
    key: 'chen-herring',
    citation: 'Chen & Herring (1997), C=0.0032',
    prepare: () => chenHerringGradientMapping,
    mapBatch(elevationsRad, sinElevations, _hydrostatic, out) {
      // sin e · tan e = s² / √(1 − s²) with s = sin e: a square root instead of a second transcendental
      // call (Math.tan) per direction; equal to the single-elevation form to 1e-12 (test/domain/mapping.test.ts).
      for (let i = 0; i < elevationsRad.length; i++) {
        const e = elevationsRad[i]!;
        if (e >= ZENITH_RAD) {
          out[i] = 0;
          continue;
        }
        const s = sinElevations[i]!;
        out[i] = 1 / ((s * s) / Math.sqrt(1 - s * s) + CHEN_HERRING_C);
      }
    },
  },
  tilting: {
    key: 'tilting',
    citation: 'tilted atmosphere m_h(e) cot(e) (MacMillan 1995)',
    prepare: (mapping) => (e) => (e >= ZENITH_RAD ? 0 : mapping.hydrostatic(e) / Math.tan(e)),
    mapBatch(elevationsRad, _sinElevations, hydrostatic, out) {
      for (let i = 0; i < elevationsRad.length; i++) {
        const e = elevationsRad[i]!;
        out[i] = e >= ZENITH_RAD ? 0 : hydrostatic[i]! / Math.tan(e);
      }
    },
  },
};

export const GRADIENT_MODEL_KEYS = Object.keys(GRADIENT_MODELS) as [string, ...string[]];
export const DEFAULT_GRADIENT_MODEL = 'chen-herring';
