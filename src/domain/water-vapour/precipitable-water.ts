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
    zwdSigmaM = wetDelaySigmaM(input.ztdSigmaM ?? 0, input.pressureSigmaHpa ?? 0, latitudeRad, heightM);
  } else if (input.zwdM !== undefined) {
    if (input.pressureHpa !== undefined) zhdM = zenithHydrostaticDelayM(input.pressureHpa, latitudeRad, heightM);
    zwdM = input.zwdM;
    zwdSigmaM = input.zwdSigmaM ?? input.ztdSigmaM ?? 0;
  } else {
    throw new ModelDomainError(at('ztd_m'), 'one of ztd_m (1..3 m) or zwd_m (0..1 m) is required', 400);
  }
  if (zwdM < 0) warnings.push(negativeWetDelayWarning(zwdM, field));

  let tmK: number;
  let tmSigmaK: number;
  if (input.tmK !== undefined) {
    tmK = input.tmK;
    tmSigmaK = input.tmSigmaK ?? 0;
  } else if (input.temperatureC !== undefined) {
    tmK = bevisMeanTemperatureK(input.temperatureC + CELSIUS_ZERO_K);
    tmSigmaK = BEVIS_TM_SIGMA_K;
    if (outsideBevisFit(input.temperatureC)) warnings.push(tmExtrapolatedWarning(input.temperatureC, field));
  } else {
    throw new ModelDomainError(at('temperature_c'), 'PWV needs temperature_c (−90..60 °C) or tm_k (200..330 K); neither is defaulted', 400);
  }

  const pwv = pwvFromWetDelay(zwdM, zwdSigmaM, tmK, tmSigmaK);
  return { zhdM, zwdM, zwdSigmaM, tmK, tmSigmaK, conversionFactor: pwv.conversionFactor, pwvMm: pwv.pwvMm, pwvSigmaMm: pwv.pwvSigmaMm, warnings };
}

/** The numbers of precipitableWater for one record of a series, with its two warning conditions as flags. */
export interface SurfaceMetPwv extends Omit<PwvResult, 'zhdM' | 'warnings'> {
  zhdM: number;
  /** ZWD < 0: the text is negativeWetDelayWarning(zwdM, field) */
  wetDelayNegative: boolean;
  /** Tm extrapolated: the text is tmExtrapolatedWarning(temperatureC, field) */
  tmExtrapolated: boolean;
}

/**
 * precipitableWater for the common case of a stored series — ZTD, measured pressure (σ_P = 0) and
 * temperature, Tm from Bevis — by the same steps and functions, with the same results, but without
 * the checks of optional inputs and without building warning texts: a station-year has 100 000
 * records and almost never a warning.
 *
 * @param ztdM zenith total delay [m]; ztdSigmaM its sigma [m] (null: unknown, taken as 0)
 * @param pressureHpa surface pressure at the antenna [hPa]; temperatureC surface temperature [°C]
 * @param latitudeRad geodetic latitude [rad]; heightM site height [m]
 */
export function precipitableWaterFromSurfaceMet(
  ztdM: number,
  ztdSigmaM: number | null,
  pressureHpa: number,
  temperatureC: number,
  latitudeRad: number,
  heightM: number,
): SurfaceMetPwv {
  const zhdM = zenithHydrostaticDelayM(pressureHpa, latitudeRad, heightM);
  const zwdM = ztdM - zhdM;
  const zwdSigmaM = wetDelaySigmaM(ztdSigmaM ?? 0, 0, latitudeRad, heightM);
  const tmK = bevisMeanTemperatureK(temperatureC + CELSIUS_ZERO_K);
  const pwv = pwvFromWetDelay(zwdM, zwdSigmaM, tmK, BEVIS_TM_SIGMA_K);
  return {
    zhdM,
    zwdM,
    zwdSigmaM,
    tmK,
    tmSigmaK: BEVIS_TM_SIGMA_K,
    conversionFactor: pwv.conversionFactor,
    pwvMm: pwv.pwvMm,
    pwvSigmaMm: pwv.pwvSigmaMm,
    wetDelayNegative: zwdM < 0,
    tmExtrapolated: outsideBevisFit(temperatureC),
  };
}

/** σ_ZWD² = σ_ZTD² + (∂ZHD/∂P · σ_P)² [m], for ZWD = ZTD − ZHD(P) with independent errors. */
function wetDelaySigmaM(ztdSigmaM: number, pressureSigmaHpa: number, latitudeRad: number, heightM: number): number {
  return Math.hypot(ztdSigmaM, zenithHydrostaticDelayPerHpa(latitudeRad, heightM) * pressureSigmaHpa);
}

/**
 * PWV = Π(Tm)·ZWD (Bevis et al. 1994) and σ_PWV² = (Π σ_ZWD)² + (ZWD · ∂Π/∂Tm · σ_Tm)²: the
 * numeric core of both functions above. ZWD, σ_ZWD [m]; Tm, σ_Tm [K]; Π [-]; PWV, σ_PWV [mm].
 */
function pwvFromWetDelay(zwdM: number, zwdSigmaM: number, tmK: number, tmSigmaK: number) {
  const pi = conversionFactor(tmK);
  const pwvM = pi * zwdM;
  const pwvSigmaM = Math.hypot(pi * zwdSigmaM, zwdM * conversionFactorPerKelvin(tmK) * tmSigmaK);
  return { conversionFactor: pi, pwvMm: pwvM * 1000, pwvSigmaMm: pwvSigmaM * 1000 };
}

/** Surface temperature [°C] outside the data of the Bevis Tm regression (BEVIS_TM_FIT_RANGE_K). */
function outsideBevisFit(temperatureC: number): boolean {
  const surfaceK = temperatureC + CELSIUS_ZERO_K;
  return surfaceK < BEVIS_TM_FIT_RANGE_K.min || surfaceK > BEVIS_TM_FIT_RANGE_K.max;
}

const fieldPath = (field: string, name: string) => (field ? `${field}.${name}` : name);

/** Warning text for ZWD < 0 [m]; `field` is the path prefix, e.g. "records.3". */
export const negativeWetDelayWarning = (zwdM: number, field = ''): string =>
  `${fieldPath(field, 'zwd_m')}: wet delay ${(zwdM * 1000).toFixed(1)} mm is negative (ZTD below the hydrostatic delay); PWV is negative too`;

/** Warning text for a surface temperature [°C] outside the Bevis regression data. */
export const tmExtrapolatedWarning = (temperatureC: number, field = ''): string =>
  `${fieldPath(field, 'temperature_c')}: ${temperatureC} °C is outside the data of the Bevis Tm regression; Tm is extrapolated`;
