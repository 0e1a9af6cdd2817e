/**
 * Zenith wet delay (ZWD) from surface meteorology. Two published models, chosen by key:
 *
 * "saastamoinen": Saastamoinen (1972), "Atmospheric correction for the troposphere and stratosphere
 *   in radio ranging of satellites", Geophys. Monogr. 15, AGU:
 *     ZWD = 0.002277 (1255/T + 0.05) e        [m]        (from memory)
 *   T surface temperature [K], e surface vapour pressure [hPa].
 *
 * "askne-nordius": Askne & Nordius (1987), Radio Sci. 22(3), 379–386, eq. 22 (form from memory):
 *     ZWD = 1e-6 (k2' + k3/Tm) Rd e / (g_m (λ + 1))     [m]
 *   with the refractivity constants of Bevis et al. (1994) (k2' = 22.1 K/hPa, k3 = 3.739e5 K²/hPa),
 *   Rd = 287.0464 J/(kg K), g_m = 9.784 m/s², and two assumptions we document here:
 *   - water vapour decrease factor λ = 3 (vapour pressure falling as (P/P0)^(λ+1); a typical
 *     mid-latitude value, common practice), and
 *   - Tm from Askne & Nordius's own relation for a constant lapse rate β = 6.5 K/km:
 *       Tm = T (1 − β Rd / (g_m (λ + 1)))  ≈ 0.9523 T       (eq. 20 there, from memory).
 *
 * Valid range (both): T 183..333 K (−90..60 °C), e 0..(saturation) hPa. A negative vapour pressure
 * is an error.
 */

import { BEVIS_1994, G_MEAN_M_S2, RD_J_PER_KG_K } from '../constants.js';
import { ModelDomainError } from '../errors.js';

export const ASKNE_NORDIUS_LAMBDA = 3;
export const ASKNE_NORDIUS_LAPSE_RATE_K_PER_M = 0.0065;

export interface WetDelayModel {
  key: string;
  citation: string;
  /**
   * @param temperatureK surface temperature [K]
   * @param vapourPressureHpa surface water vapour pressure [hPa]
   * @returns zenith wet delay [m]
   */
  zenithWetDelayM(temperatureK: number, vapourPressureHpa: number): number;
}

/** Saastamoinen (1972) wet delay (from memory). */
export function saastamoinenWetDelayM(temperatureK: number, vapourPressureHpa: number): number {
  checkWetInputs(temperatureK, vapourPressureHpa);
  return 0.002277 * (1255 / temperatureK + 0.05) * vapourPressureHpa;
}

/** Tm assumed by Askne & Nordius (1987) for lapse rate β and decrease factor λ [K]. */
export function askneNordiusMeanTemperatureK(temperatureK: number): number {
  return temperatureK * (1 - (ASKNE_NORDIUS_LAPSE_RATE_K_PER_M * RD_J_PER_KG_K) / (G_MEAN_M_S2 * (ASKNE_NORDIUS_LAMBDA + 1)));
}

/** Askne & Nordius (1987) wet delay with the assumptions in the module comment. */
export function askneNordiusWetDelayM(temperatureK: number, vapourPressureHpa: number): number {
  checkWetInputs(temperatureK, vapourPressureHpa);
  const tmK = askneNordiusMeanTemperatureK(temperatureK);
  // k in K/Pa and e in Pa keep the SI units of Rd and g.
  const k2PrimeKPerPa = BEVIS_1994.k2prime_K_per_hPa / 100;
  const k3K2PerPa = BEVIS_1994.k3_K2_per_hPa / 100;
  const ePa = vapourPressureHpa * 100;
  return (1e-6 * (k2PrimeKPerPa + k3K2PerPa / tmK) * RD_J_PER_KG_K * ePa) / (G_MEAN_M_S2 * (ASKNE_NORDIUS_LAMBDA + 1));
}

function checkWetInputs(temperatureK: number, vapourPressureHpa: number): void {
  if (!(temperatureK >= 183 && temperatureK <= 333)) {
    throw new ModelDomainError(
      'temperature_c',
      `wet delay models are defined for −90..60 °C, got ${(temperatureK - 273.15).toFixed(2)} °C`,
    );
  }
  if (!(vapourPressureHpa >= 0)) {
    throw new ModelDomainError('vapour_pressure_hpa', `vapour pressure must be ≥ 0 hPa, got ${vapourPressureHpa}`);
  }
}

export const WET_MODELS: Record<string, WetDelayModel> = {
  saastamoinen: {
    key: 'saastamoinen',
    citation: 'Saastamoinen (1972)',
    zenithWetDelayM: saastamoinenWetDelayM,
  },
  'askne-nordius': {
    key: 'askne-nordius',
    citation: 'Askne & Nordius (1987), lambda=3, lapse 6.5 K/km',
    zenithWetDelayM: askneNordiusWetDelayM,
  },
};

export const WET_MODEL_KEYS = Object.keys(WET_MODELS) as [string, ...string[]];
export const DEFAULT_WET_MODEL = 'saastamoinen';
