/**
 * A-priori zenith delays at a site from surface met (measured, reduced or standard atmosphere).
 */

import { CELSIUS_ZERO_K } from '../constants.js';
import { resolveSurfaceMet, type MetInput, type ResolvedMet } from '../meteo/surface-met.js';
import { latitudeRad, type Site } from '../site.js';
import { zenithHydrostaticDelayM } from './hydrostatic.js';
import { WET_MODELS } from './wet.js';

export interface AprioriZenith {
  zhdM: number;
  zwdM: number;
  ztdM: number;
  met: ResolvedMet;
}

/**
 * @param site site (deg, m)
 * @param met measured met, possibly partial or absent
 * @param wetModelKey key of WET_MODELS
 */
export function aprioriZenithDelays(site: Site, met: MetInput | undefined, wetModelKey: string): AprioriZenith {
  const resolved = resolveSurfaceMet(site.heightM, met);
  const wetModel = WET_MODELS[wetModelKey];
  if (!wetModel) throw new Error(`unknown wet model ${wetModelKey}`);
  const zhdM = zenithHydrostaticDelayM(resolved.pressureHpa, latitudeRad(site), site.heightM);
  const zwdM = wetModel.zenithWetDelayM(resolved.temperatureC + CELSIUS_ZERO_K, resolved.vapourPressureHpa);
  return { zhdM, zwdM, ztdM: zhdM + zwdM, met: resolved };
}
