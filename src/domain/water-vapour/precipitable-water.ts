/**
 * Precipitable water from a zenith delay and surface met, with its propagated uncertainty.
 *
 *   ZWD = ZTD − ZHD(P)          (when a total delay is given; ZHD by Saastamoinen/Davis, zenith/hydrostatic.ts)
 *   Tm  = caller's tm_k, else Bevis et al. (1992) from the surface temperature
 *   PWV = Π(Tm) · ZWD           (Bevis et al. 1994)
 *
 * Uncertainty, first-order propagation with independent inputs:
 *   σ_ZWD² = σ_ZTD² + (∂ZHD/∂P · σ_P)²           (or the caller's σ_ZWD)
 *   σ_PWV² = (Π σ_ZWD)² + (ZWD · ∂Π/∂Tm · σ_Tm)²
 * with σ_Tm = 4.74 K (the scatter of the Bevis regression) when Tm comes from it, and the caller's
 * tm_sigma_k (default 0) when Tm is supplied.
 */

import { CELSIUS_ZERO_K } from '../constants.js';
import { ModelDomainError } from '../errors.js';
import { zenithHydrostaticDelayM, zenithHydrostaticDelayPerHpa } from '../zenith/hydrostatic.js';
import { conversionFactor, conversionFactorPerKelvin } from './conversion.js';
import { BEVIS_TM_FIT_RANGE_K, BEVIS_TM_SIGMA_K, bevisMeanTemperatureK } from './mean-temperature.js';

export interface PwvInput {
  ztdM?: number | undefined;
  zwdM?: number | undefined;
  ztdSigmaM?: number | undefined;
  zwdSigmaM?: number | undefined;
  pressureHpa?: number | undefined;
  pressureSigmaHpa?: number | undefined;
  temperatureC?: number | undefined;
  tmK?: number | undefined;
  tmSigmaK?: number | undefined;
}

export interface PwvResult {
  zhdM: number | null;
  zwdM: number;
  zwdSigmaM: number;
  tmK: number;
  tmSigmaK: number;
  conversionFactor: number;
  pwvMm: number;
  pwvSigmaMm: number;
  warnings: string[];
}

/**
 * @param input delays [m], pressure [hPa], temperature [°C], Tm [K] and their sigmas
 * @param latitudeRad geodetic latitude [rad]
 * @param heightM site height [m]
 * @param field path prefix for error messages, e.g. "records.3"
 * @throws ModelDomainError when a value that decides the answer is missing (never defaulted)
 */
export function precipitableWater(input: PwvInput, latitudeRad: number, heightM: number, field = ''): PwvResult {
  const at = (name: string) => (field ? `${field}.${name}` : name);
  const warnings: string[] = [];

  let zhdM: number | null = null;
  let zwdM: number;
  let zwdSigmaM: number;
  if (input.ztdM !== undefined) {
    if (input.pressureHpa === undefined) {
      throw new ModelDomainError(at('pressure_hpa'), 'a total delay needs the measured surface pressure (300..1100 hPa) to split off the hydrostatic part; it is never defaulted', 400);
    }
    zhdM = zenithHydrostaticDelayM(input.pressureHpa, latitudeRad, heightM);
    zwdM = input.ztdM - zhdM;
    const zhdSigmaM = zenithHydrostaticDelayPerHpa(latitudeRad, heightM) * (input.pressureSigmaHpa ?? 0);
    zwdSigmaM = Math.hypot(input.ztdSigmaM ?? 0, zhdSigmaM);
  } else if (input.zwdM !== undefined) {
    if (input.pressureHpa !== undefined) zhdM = zenithHydrostaticDelayM(input.pressureHpa, latitudeRad, heightM);
    zwdM = input.zwdM;
    zwdSigmaM = input.zwdSigmaM ?? input.ztdSigmaM ?? 0;
  } else {
    throw new ModelDomainError(at('ztd_m'), 'one of ztd_m (1..3 m) or zwd_m (0..1 m) is required', 400);
  }
  if (zwdM < 0) {
    warnings.push(`${at('zwd_m')}: wet delay ${(zwdM * 1000).toFixed(1)} mm is negative (ZTD below the hydrostatic delay); PWV is negative too`);
  }

  let tmK: number;
  let tmSigmaK: number;
  if (input.tmK !== undefined) {
    tmK = input.tmK;
    tmSigmaK = input.tmSigmaK ?? 0;
  } else if (input.temperatureC !== undefined) {
    const surfaceK = input.temperatureC + CELSIUS_ZERO_K;
    tmK = bevisMeanTemperatureK(surfaceK);
    tmSigmaK = BEVIS_TM_SIGMA_K;
    if (surfaceK < BEVIS_TM_FIT_RANGE_K.min || surfaceK > BEVIS_TM_FIT_RANGE_K.max) {
      warnings.push(`${at('temperature_c')}: ${input.temperatureC} °C is outside the data of the Bevis Tm regression; Tm is extrapolated`);
    }
  } else {
    throw new ModelDomainError(at('temperature_c'), 'PWV needs temperature_c (−90..60 °C) or tm_k (200..330 K); neither is defaulted', 400);
  }

  const pi = conversionFactor(tmK);
  const pwvM = pi * zwdM;
  const pwvSigmaM = Math.hypot(pi * zwdSigmaM, zwdM * conversionFactorPerKelvin(tmK) * tmSigmaK);
  return {
    zhdM,
    zwdM,
    zwdSigmaM,
    tmK,
    tmSigmaK,
    conversionFactor: pi,
    pwvMm: pwvM * 1000,
    pwvSigmaMm: pwvSigmaM * 1000,
    warnings,
  };
}
