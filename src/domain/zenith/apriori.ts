/**
 * A-priori zenith delays at a site from surface met (measured, reduced or standard atmosphere).
 *
 * Heights: the site comes with its height above the WGS84 ellipsoid (the API's datum), and so does
 * the met sensor. The standard atmosphere is defined on heights above mean sea level, so both are
 * taken down by the EGM96 geoid undulation N (geometry/geoid.ts) before it is used; the height
 * reduction between sensor and site needs only their difference, which N does not change.
 * Saastamoinen's ZHD (hydrostatic.ts) keeps the ellipsoidal height in its gravity term: N moves
 * that term by at most 2.8e-5 (0.06 mm of a 2.3 m ZHD for |N| = 100 m), well inside the formula's
 * own uncertainty, and the stored series stay comparable with the results of earlier versions.
 */

import { CELSIUS_ZERO_K } from '../constants.js';
import { geoidUndulationM } from '../geometry/geoid.js';
import { resolveSurfaceMet, type MetInput, type ResolvedMet } from '../meteo/surface-met.js';
import { latitudeRad, type Site } from '../site.js';
import { zenithHydrostaticDelayM } from './hydrostatic.js';
import { WET_MODELS } from './wet.js';

export interface AprioriZenith {
  zhdM: number;
  zwdM: number;
  ztdM: number;
  met: ResolvedMet;
  /** EGM96 geoid undulation N used to turn the ellipsoidal heights into heights above sea level [m]. */
  geoidUndulationM: number;
}

/**
 * @param site site (deg, m above the ellipsoid)
 * @param met measured met, possibly partial or absent; `heightM` above the ellipsoid
 * @param wetModelKey key of WET_MODELS
 */
export function aprioriZenithDelays(site: Site, met: MetInput | undefined, wetModelKey: string): AprioriZenith {
  const n = geoidUndulationM(site.latitudeDeg, site.longitudeDeg);
  const seaLevelMet = met && { ...met, heightM: met.heightM === undefined ? undefined : met.heightM - n };
  const resolved = resolveSurfaceMet(site.heightM - n, seaLevelMet);
  const wetModel = WET_MODELS[wetModelKey];
  if (!wetModel) throw new Error(`unknown wet model ${wetModelKey}`);
  const zhdM = zenithHydrostaticDelayM(resolved.pressureHpa, latitudeRad(site), site.heightM);
  const zwdM = wetModel.zenithWetDelayM(resolved.temperatureC + CELSIUS_ZERO_K, resolved.vapourPressureHpa);
  return { zhdM, zwdM, ztdM: zhdM + zwdM, met: resolved, geoidUndulationM: n };
}
