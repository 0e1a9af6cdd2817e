/**
 * Zenith delays, precipitable water and Tm of a column of shells (shells.ts).
 *
 * - ZHD = 1e-6 ∫N_h dz = 1e-6 k1 Rd ∫ρ dz = 1e-6 k1 Rd ∫0^Ps dP/γ(φ, z(P))
 *   (Davis et al. 1985, Radio Sci. 20(6), eqs. 6 and 10 before the mean-gravity approximation):
 *   the hydrostatic equation turns the height integral of density into a pressure integral, with
 *   normal gravity varying with latitude and height (gravity.ts). Trapezoid rule in P; above the
 *   ceiling the remaining pressure is divided by γ at the ceiling. This is `zhdM`. With the
 *   compressibility factors included the result is the same (it depends on density only).
 * - The same delay by integrating N_h over the given heights, `zhdHeightIntegralM`: equal to ZHD when
 *   the profile's heights and pressures are in hydrostatic balance. It is the zenith value of the ray
 *   tracer and the denominator of the traced hydrostatic mapping factor.
 * - ZWD = 1e-6 ∫N_w dz (Davis et al. 1985, eq. 7).
 * - PWV = ∫ρv dz / ρw with ρv = e/(Rv T) (Zw⁻¹) (e.g. Bevis et al. 1992, eq. 5; common practice).
 * - Tm = ∫(e/T) dz / ∫(e/T²) dz (Davis et al. 1985, eq. 18; Bevis et al. 1992, eq. 9);
 *   null for a dry column.
 * - Mean gravity of the column g_m = Ps / ∫dP/γ [m/s²] (what Saastamoinen's formula approximates).
 *
 * Valid for any column built by shells.ts (pressures decreasing, temperatures > 0 K). Outputs in m,
 * mm (PWV) and K (Tm).
 */

import { RD_J_PER_KG_K, RHO_WATER_KG_M3 } from '../constants.js';
import { PER_N_UNIT } from './constants.js';
import type { RefractivityConstants } from './refractivity.js';
import type { ShellColumn } from './shells.js';

export interface ZenithIntegrals {
  zhdM: number;
  zhdHeightIntegralM: number;
  zwdM: number;
  pwvMm: number;
  tmK: number | null;
  meanGravityM_S2: number;
  /** Hydrostatic delay above the profile's top level [m]. */
  extensionZhdM: number;
}

export function zenithIntegrals(column: ShellColumn, constants: RefractivityConstants): ZenithIntegrals {
  const { heightM, pressureHpa, gravityM_S2, hydrostaticN, wetN, vapourDensityKgM3, eOverT, eOverT2, shells, topNode } = column;
  let pressureOverGravity = 0;
  let extensionPressureOverGravity = 0;
  let hydrostaticSum = 0;
  let wetSum = 0;
  let vapourSum = 0;
  let eOverTSum = 0;
  let eOverT2Sum = 0;
  for (let j = 0; j < shells; j++) {
    const dz = heightM[j + 1]! - heightM[j]!;
    const term = (pressureHpa[j]! - pressureHpa[j + 1]!) * 0.5 * (1 / gravityM_S2[j]! + 1 / gravityM_S2[j + 1]!);
    pressureOverGravity += term;
    if (j >= topNode) extensionPressureOverGravity += term;
    hydrostaticSum += hydrostaticN[j]! * dz;
    wetSum += wetN[j]! * dz;
    vapourSum += vapourDensityKgM3[j]! * dz;
    eOverTSum += eOverT[j]! * dz;
    eOverT2Sum += eOverT2[j]! * dz;
  }
  const remainder = pressureHpa[shells]! / gravityM_S2[shells]!;
  pressureOverGravity += remainder;
  extensionPressureOverGravity += remainder;
  // k1 [K/hPa] · Rd [J/(kg K)] · P [hPa] / g [m/s²] · 1e-6 = metres (hPa cancels).
  const hydrostaticFactor = PER_N_UNIT * constants.k1KPerHpa * RD_J_PER_KG_K;
  return {
    zhdM: hydrostaticFactor * pressureOverGravity,
    zhdHeightIntegralM: PER_N_UNIT * hydrostaticSum,
    zwdM: PER_N_UNIT * wetSum,
    pwvMm: (1000 * vapourSum) / RHO_WATER_KG_M3,
    tmK: eOverT2Sum > 0 ? eOverTSum / eOverT2Sum : null,
    meanGravityM_S2: pressureHpa[0]! / pressureOverGravity,
    extensionZhdM: hydrostaticFactor * extensionPressureOverGravity,
  };
}
