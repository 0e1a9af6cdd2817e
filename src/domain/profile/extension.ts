/**
 * Extension of a profile above its top level.
 *
 * Above the top the column is continued as a dry, isothermal atmosphere at the top temperature in
 * hydrostatic equilibrium, with gravity decreasing with height (gravity.ts):
 *
 *   dP/dz = −P γ(φ, z) / (Rd T_top)            (hydrostatic equation and ideal gas law;
 *                                               e.g. Wallace & Hobbs (2006) eqs. 3.17, 3.2)
 *
 * up to the ceiling, the first node where the pressure falls below EXTENSION_STOP_FRACTION of the
 * surface pressure (there 1e-6 of the ZHD remains; it is added to the ZHD, and the ray tracer takes
 * n = 1 above the ceiling), and at most EXTENSION_MAX_THICKNESS_M above the top.
 *
 * The hydrostatic delay of the extension, 1e-6 k1 Rd ∫dP/γ, does not depend on the assumed
 * temperature: only its shape (the scale height Rd T/γ) does, and with it a little of the
 * hydrostatic mapping factor at low elevations. The wet delay above the top is taken as zero
 * (profile-delays.ts warns when the vapour pressure at the top makes that questionable).
 *
 * Valid for a top above 10 km (levels.ts enforces it), where at most about a quarter of the ZHD lies in
 * the extension; any top temperature > 0 K.
 */

import { RD_J_PER_KG_K } from '../constants.js';
import type { GravityAtLatitude } from './gravity.js';

export const EXTENSION_STOP_FRACTION = 1e-6;
export const EXTENSION_MAX_THICKNESS_M = 150_000;
/** Node spacing in the extension as a fraction of the scale height (resolution 1). */
export const EXTENSION_STEP_SCALE_HEIGHTS = 0.1;

export interface Extension {
  /** Heights of the nodes above the top level [m] (the top level itself excluded). */
  heightM: number[];
  /** Pressures at those nodes [hPa]. */
  pressureHpa: number[];
  temperatureK: number;
  /** Scale height Rd T / γ at the top [m]. */
  scaleHeightM: number;
}

/**
 * @param topHeightM height of the top level [m]
 * @param topPressureHpa pressure at the top level [hPa]
 * @param topTemperatureK temperature at the top level [K]
 * @param surfacePressureHpa pressure at the bottom of the column [hPa]
 * @param gravity normal gravity at the site latitude
 * @param resolution 1 for the default node spacing, 2 for half of it, …
 */
export function isothermalExtension(
  topHeightM: number,
  topPressureHpa: number,
  topTemperatureK: number,
  surfacePressureHpa: number,
  gravity: GravityAtLatitude,
  resolution = 1,
): Extension {
  const scaleHeightM = (RD_J_PER_KG_K * topTemperatureK) / gravity.at(topHeightM);
  const stepM = (EXTENSION_STEP_SCALE_HEIGHTS * scaleHeightM) / resolution;
  const stopHpa = EXTENSION_STOP_FRACTION * surfacePressureHpa;
  const heightM: number[] = [];
  const pressureHpa: number[] = [];
  let z = topHeightM;
  let p = topPressureHpa;
  while (p >= stopHpa && z - topHeightM < EXTENSION_MAX_THICKNESS_M) {
    const zNext = z + stepM;
    const meanGravity = (gravity.at(z) + gravity.at(zNext)) / 2;
    p *= Math.exp((-meanGravity * stepM) / (RD_J_PER_KG_K * topTemperatureK));
    z = zNext;
    heightM.push(z);
    pressureHpa.push(p);
  }
  return { heightM, pressureHpa, temperatureK: topTemperatureK, scaleHeightM };
}
