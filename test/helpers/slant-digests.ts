/**
 * Digests of the slant path's whole output (src/domain/slant.ts computeSlantDelays: the three mapping-factor
 * columns and the four delay columns) for every mapping model × gradient model, for changes to the batch
 * loops that must not move a bit. A digest is SHA-256 of the columns' float64 bytes, so signed zeros and
 * every last bit count (JSON text would print −0 as 0).
 *
 * The cases take the registries and the slant functions as arguments, so that the same cases run against an
 * older source tree (`git archive <commit> src | tar -x -C <dir>`, then import its registry.ts,
 * gradient-mapping.ts and slant.ts) to record the expected digests.
 */

import { createHash } from 'node:crypto';
import type { GradientModel } from '../../src/domain/gradients/gradient-mapping.js';
import type { MappingContext, MappingModel } from '../../src/domain/mapping/types.js';
import type { ZenithForSlant } from '../../src/domain/slant.js';

/** What the cases need of a source tree (the current one or an older one). */
export interface SlantLibrary {
  mappingModels: Record<string, MappingModel>;
  gradientModels: Record<string, GradientModel>;
  computeSlantDelays(
    mapping: ReturnType<MappingModel['prepare']>,
    gradientModel: GradientModel,
    zenith: ZenithForSlant,
    elevationsRad: ArrayLike<number>,
    azimuthsRad: ArrayLike<number>,
    out: never,
  ): unknown;
  allocateSlantBatch(n: number): Record<string, Float64Array>;
}

/** The output columns digested, in this order (a work column added later is not part of the answer). */
const OUTPUT_COLUMNS = ['mappingHydrostatic', 'mappingWet', 'mappingGradient', 'hydrostaticM', 'wetM', 'gradientM', 'totalM'];

const DEG = Math.PI / 180;

/**
 * Directions: elevations every 0.01° from 1° to 90° (8 901, the zenith exactly π/2 at the end) and a few
 * just below the zenith; azimuths stepping 37.3° around the horizon, with every quadrant edge (0, π/2, π,
 * 3π/2, 2π) met, so that the signed zeros of the gradient-free term occur.
 */
function directions(): { elevationsRad: Float64Array; azimuthsRad: Float64Array } {
  const elevationsDeg = [...Array.from({ length: 8901 }, (_, i) => 1 + i / 100), 89.9999, 89.999999, 90 - 1e-9];
  const n = elevationsDeg.length;
  const elevationsRad = Float64Array.from(elevationsDeg, (d) => d * DEG);
  const azimuthsRad = Float64Array.from({ length: n }, (_, i) => ((i * 37.3) % 360) * DEG);
  [0, Math.PI / 2, Math.PI, 1.5 * Math.PI, 2 * Math.PI].forEach((a, k) => (azimuthsRad[k * 1000] = a));
  return { elevationsRad, azimuthsRad };
}

/** Sites and epochs: both hemispheres, sea level and 1.2 km, both VMF1 height references (coefficients ignored by the rest). */
const CONTEXTS: Record<string, MappingContext> = {
  'φ 47°, 400 m, day 172.3, site coefficients': {
    latitudeRad: 47 * DEG,
    heightM: 400,
    dayOfYear: 172.3,
    coefficients: { ah: 0.00121, aw: 0.00055, heightReference: 'site' },
  },
  'φ −63°, 1.2 km, day 300.5, sea-level coefficients': {
    latitudeRad: -63 * DEG,
    heightM: 1200,
    dayOfYear: 300.5,
    coefficients: { ah: 0.00125, aw: 0.0005, heightReference: 'sea-level' },
  },
  'φ 5°, −20 m, day 1, sea-level coefficients': {
    latitudeRad: 5 * DEG,
    heightM: -20,
    dayOfYear: 1,
    coefficients: { ah: 0.0013, aw: 0.0006, heightReference: 'sea-level' },
  },
};

const ZENITHS: Record<string, ZenithForSlant> = {
  gradients: { zhdM: 2.25, zwdM: 0.12, northGradientM: 0.0005, eastGradientM: -0.0003 },
  'no gradients': { zhdM: 2.31, zwdM: 0.21, northGradientM: 0, eastGradientM: 0 },
};

/** SHA-256 (hex) of the output columns' bytes. */
function columnsDigest(out: Record<string, Float64Array>): string {
  const hash = createHash('sha256');
  for (const name of OUTPUT_COLUMNS) {
    const column = out[name]!;
    hash.update(new Uint8Array(column.buffer, column.byteOffset, column.byteLength));
  }
  return hash.digest('hex');
}

/** Named cases ("mapping + gradient, context, zenith") → digest of computeSlantDelays's output. */
export function slantDigests(lib: SlantLibrary): Record<string, string> {
  const { elevationsRad, azimuthsRad } = directions();
  const digests: Record<string, string> = {};
  for (const [mappingKey, mappingModel] of Object.entries(lib.mappingModels)) {
    for (const [gradientKey, gradientModel] of Object.entries(lib.gradientModels)) {
      for (const [contextName, context] of Object.entries(CONTEXTS)) {
        for (const [zenithName, zenith] of Object.entries(ZENITHS)) {
          const out = lib.allocateSlantBatch(elevationsRad.length);
          lib.computeSlantDelays(mappingModel.prepare(context), gradientModel, zenith, elevationsRad, azimuthsRad, out as never);
          digests[`${mappingKey} + ${gradientKey}, ${contextName}, ${zenithName}`] = columnsDigest(out);
        }
      }
    }
  }
  return digests;
}
