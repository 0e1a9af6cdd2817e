/**
 * Conversion of zenith wet delay to precipitable water, PWV = Π · ZWD.
 *
 * Bevis, M. et al. (1994), GPS meteorology: mapping zenith wet delays onto precipitable water,
 * J. Appl. Meteorol. 33, 379–386, eq. 6 (constants from memory, docs/constants.md):
 *
 *   Π = 10^6 / (ρw Rv (k3/Tm + k2'))       [-]
 *
 * with ρw = 1000 kg/m³, Rv = 461.5 J/(kg K), k2' = 22.1 K/hPa = 0.221 K/Pa,
 * k3 = 3.739e5 K²/hPa = 3739 K²/Pa, Tm [K]. Π ≈ 0.15–0.16 for realistic Tm (1 mm of PWV is about
 * 6.5 mm of ZWD).
 *
 * Valid for Tm 200..330 K.
 */

import { BEVIS_1994, BEVIS_1994_SIGMA, RHO_WATER_KG_M3, RV_J_PER_KG_K } from '../constants.js';

const K3_K2_PER_PA = BEVIS_1994.k3_K2_per_hPa / 100;

/** The two refractivity constants Π depends on: k2' [K/hPa], k3 [K²/hPa]. */
export interface RefractivityConstants {
  k2prime_K_per_hPa: number;
  k3_K2_per_hPa: number;
}

/**
 * @param tmK weighted mean temperature [K]
 * @param k refractivity constants (default Bevis et al. 1994); other values serve error propagation
 * @returns Π [-]
 */
export function conversionFactor(tmK: number, k: RefractivityConstants = BEVIS_1994): number {
  return 1e6 / (RHO_WATER_KG_M3 * RV_J_PER_KG_K * (k.k3_K2_per_hPa / 100 / tmK + k.k2prime_K_per_hPa / 100));
}

/**
 * Standard uncertainty of Π from those of k2' and k3 (BEVIS_1994_SIGMA), first order:
 *   ∂Π/∂k2' = −Π² ρw Rv / 10^6,  ∂Π/∂k3 = −Π² ρw Rv / (10^6 Tm)   (k in K/Pa, K²/Pa)
 * About 0.35 % of Π at Tm = 270 K, 0.3 % of it from k3.
 *
 * @param tmK weighted mean temperature [K] @returns σ_Π [-]
 */
export function conversionFactorSigmaFromConstants(tmK: number): number {
  const pi = conversionFactor(tmK);
  const scale = (pi * pi * RHO_WATER_KG_M3 * RV_J_PER_KG_K) / 1e6;
  return Math.hypot(scale * (BEVIS_1994_SIGMA.k2prime_K_per_hPa / 100), (scale * (BEVIS_1994_SIGMA.k3_K2_per_hPa / 100)) / tmK);
}

/** dΠ/dTm [1/K], for propagating an uncertainty of Tm. */
export function conversionFactorPerKelvin(tmK: number): number {
  const pi = conversionFactor(tmK);
  return (pi * pi * RHO_WATER_KG_M3 * RV_J_PER_KG_K * K3_K2_PER_PA) / (1e6 * tmK * tmK);
}
