/**
 * Precipitable water from a zenith delay and surface met, with its propagated uncertainty.
 *
 *   ZWD = ZTD − ZHD(P)          (when a total delay is given; ZHD by Saastamoinen/Davis, zenith/hydrostatic.ts)
 *   Tm  = caller's tm_k, else Bevis et al. (1992) from the surface temperature
 *   PWV = Π(Tm) · ZWD           (Bevis et al. 1994)
 *
 * Uncertainty budget: first-order propagation, each term in mm of PWV and reported on its own
 * (PwvSigmaBudget); σ_PWV is their root sum of squares, i.e. the inputs are taken as independent.
 *
 * | term          | σ of the input                                   | default when not given                       |
 * |---------------|--------------------------------------------------|----------------------------------------------|
 * | delay         | ztd_sigma_m (or zwd_sigma_m)                     | none: unknown, flagged (σ_PWV is then null at the API) |
 * | pressure      | pressure_sigma_hpa, through ∂ZHD/∂P              | 0.5 hPa (a station barometer, common practice) |
 * | zhd_model     | ± 0.0000005 m/hPa of the Saastamoinen constant   | always (IERS 2010 eq. 9.11, from memory)      |
 * | temperature   | temperature_sigma_k, through Tm = 70.2 + 0.72 Ts | 0.5 K (a screened sensor, common practice)    |
 * | tm            | tm_sigma_k, or the Bevis regression's scatter    | 4.74 K (Bevis 1992, from memory); 2 K for a   |
 * |               |                                                  | caller's tm_k (weather-model Tm, common practice) |
 * | refractivity  | k2' ± 2.2 K/hPa, k3 ± 0.012e5 K²/hPa             | always (Bevis et al. 1994, from memory)       |
 *
 * The pressure and ZHD-model terms enter only when ZWD is formed here from a total delay; the
 * temperature term only when Tm comes from the Bevis regression. The refractivity term is common
 * to all values (systematic): it does not average out over a series. The mapping functions do not
 * enter here: they act on the zenith delay while it is estimated, and belong to its σ.
 * Defaults are listed in `defaulted` (API field names) so that a caller can see what was assumed.
 */

import { CELSIUS_ZERO_K } from '../constants.js';
import { ModelDomainError } from '../errors.js';
import {
  SAASTAMOINEN_ZHD_M_PER_HPA,
  SAASTAMOINEN_ZHD_M_PER_HPA_SIGMA,
  zenithHydrostaticDelayM,
  zenithHydrostaticDelayPerHpa,
} from '../zenith/hydrostatic.js';
import { conversionFactor, conversionFactorPerKelvin, conversionFactorSigmaFromConstants } from './conversion.js';
import { BEVIS_TM_FIT_RANGE_K, BEVIS_TM_SIGMA_K, BEVIS_TM_SLOPE, bevisMeanTemperatureK } from './mean-temperature.js';

/** Defaults of the budget's input sigmas (see the module comment for their sources). */
export const PWV_SIGMA_DEFAULTS = {
  /** Barometer [hPa] (common practice). */
  pressureSigmaHpa: 0.5,
  /** Surface temperature sensor [K] (common practice). */
  temperatureSigmaK: 0.5,
  /** Caller's Tm without a σ [K] (common practice). */
  callerTmSigmaK: 2,
} as const;

/** Relative standard uncertainty of the Saastamoinen ZHD (IERS 2010 eq. 9.11, from memory) [-]. */
export const ZHD_MODEL_RELATIVE_SIGMA = SAASTAMOINEN_ZHD_M_PER_HPA_SIGMA / SAASTAMOINEN_ZHD_M_PER_HPA;

/** The σ_PWV budget, each term in mm of PWV (null: the term's σ is unknown). */
export interface PwvSigmaBudget {
  delayMm: number | null;
  pressureMm: number;
  zhdModelMm: number;
  temperatureMm: number;
  tmMm: number;
  refractivityMm: number;
  /** API names of the input sigmas that were defaulted, e.g. "pressure_sigma_hpa". */
  defaulted: string[];
}

export interface PwvInput {
  ztdM?: number | undefined;
  zwdM?: number | undefined;
  ztdSigmaM?: number | undefined;
  zwdSigmaM?: number | undefined;
  pressureHpa?: number | undefined;
  pressureSigmaHpa?: number | undefined;
  temperatureC?: number | undefined;
  temperatureSigmaK?: number | undefined;
  tmK?: number | undefined;
  tmSigmaK?: number | undefined;
}

export interface PwvResult {
  zhdM: number | null;
  zwdM: number;
  /** σ of ZWD [m]: delay, pressure and ZHD-model terms (without the delay's when it is unknown). */
  zwdSigmaM: number;
  tmK: number;
  tmSigmaK: number;
  conversionFactor: number;
  pwvMm: number;
  /** σ of PWV [mm], all terms of `sigmaBudget` (without the delay's when it is unknown). */
  pwvSigmaMm: number;
  /** False when neither ztd_sigma_m nor zwd_sigma_m was given: the σ above lack their largest term. */
  delaySigmaKnown: boolean;
  sigmaBudget: PwvSigmaBudget;
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
  let delaySigmaM: number | undefined;
  const defaulted: string[] = [];
  let pressureSigmaHpa = 0;
  let splitZhdM: number | null = null;
  if (input.ztdM !== undefined) {
    if (input.pressureHpa === undefined) {
      throw new ModelDomainError(
        at('pressure_hpa'),
        'a total delay needs the measured surface pressure (300..1100 hPa) to split off the hydrostatic part; it is never defaulted',
        400,
      );
    }
    zhdM = zenithHydrostaticDelayM(input.pressureHpa, latitudeRad, heightM);
    splitZhdM = zhdM;
    zwdM = input.ztdM - zhdM;
    delaySigmaM = input.ztdSigmaM;
    pressureSigmaHpa = input.pressureSigmaHpa ?? PWV_SIGMA_DEFAULTS.pressureSigmaHpa;
    if (input.pressureSigmaHpa === undefined) defaulted.push('pressure_sigma_hpa');
  } else if (input.zwdM !== undefined) {
    if (input.pressureHpa !== undefined) zhdM = zenithHydrostaticDelayM(input.pressureHpa, latitudeRad, heightM);
    zwdM = input.zwdM;
    delaySigmaM = input.zwdSigmaM ?? input.ztdSigmaM;
  } else {
    throw new ModelDomainError(at('ztd_m'), 'one of ztd_m (1..3 m) or zwd_m (0..1 m) is required', 400);
  }
  if (zwdM < 0) warnings.push(negativeWetDelayWarning(zwdM, field));

  let tmK: number;
  let tmSigmaK: number;
  let temperatureSigmaK = 0;
  if (input.tmK !== undefined) {
    tmK = input.tmK;
    tmSigmaK = input.tmSigmaK ?? PWV_SIGMA_DEFAULTS.callerTmSigmaK;
    if (input.tmSigmaK === undefined) defaulted.push('tm_sigma_k');
  } else if (input.temperatureC !== undefined) {
    tmK = bevisMeanTemperatureK(input.temperatureC + CELSIUS_ZERO_K);
    tmSigmaK = BEVIS_TM_SIGMA_K;
    temperatureSigmaK = input.temperatureSigmaK ?? PWV_SIGMA_DEFAULTS.temperatureSigmaK;
    if (input.temperatureSigmaK === undefined) defaulted.push('temperature_sigma_k');
    if (outsideBevisFit(input.temperatureC)) warnings.push(tmExtrapolatedWarning(input.temperatureC, field));
  } else {
    throw new ModelDomainError(at('temperature_c'), 'PWV needs temperature_c (−90..60 °C) or tm_k (200..330 K); neither is defaulted', 400);
  }

  const pwv = pwvWithBudget({ zwdM, delaySigmaM, splitZhdM, pressureSigmaHpa, tmK, tmSigmaK, temperatureSigmaK, latitudeRad, heightM });
  return { zhdM, ...pwv, tmK, tmSigmaK, sigmaBudget: { ...pwv.sigmaBudget, defaulted }, warnings };
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
 * precipitableWater for the common case of a stored series — ZTD, measured pressure and
 * temperature (their sigmas defaulted), Tm from Bevis — by the same steps and functions, with the
 * same results, but without the checks of optional inputs and without building warning texts: a
 * station-year has 100 000 records and almost never a warning.
 *
 * @param ztdM zenith total delay [m]; ztdSigmaM its sigma [m] (null: unknown, `delaySigmaKnown` false)
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
  const tmK = bevisMeanTemperatureK(temperatureC + CELSIUS_ZERO_K);
  const pwv = pwvWithBudget({
    zwdM,
    delaySigmaM: ztdSigmaM ?? undefined,
    splitZhdM: zhdM,
    pressureSigmaHpa: PWV_SIGMA_DEFAULTS.pressureSigmaHpa,
    tmK,
    tmSigmaK: BEVIS_TM_SIGMA_K,
    temperatureSigmaK: PWV_SIGMA_DEFAULTS.temperatureSigmaK,
    latitudeRad,
    heightM,
  });
  // Fields written out, no object spread: this runs once per stored record (100 000 for a station-year),
  // and spreading two objects per record cost more than all the arithmetic (profile, issue 13).
  const budget = pwv.sigmaBudget;
  return {
    zhdM,
    zwdM: pwv.zwdM,
    zwdSigmaM: pwv.zwdSigmaM,
    conversionFactor: pwv.conversionFactor,
    pwvMm: pwv.pwvMm,
    pwvSigmaMm: pwv.pwvSigmaMm,
    delaySigmaKnown: pwv.delaySigmaKnown,
    tmK,
    tmSigmaK: BEVIS_TM_SIGMA_K,
    sigmaBudget: {
      delayMm: budget.delayMm,
      pressureMm: budget.pressureMm,
      zhdModelMm: budget.zhdModelMm,
      temperatureMm: budget.temperatureMm,
      tmMm: budget.tmMm,
      refractivityMm: budget.refractivityMm,
      defaulted: SERIES_DEFAULTED.slice(),
    },
    wetDelayNegative: zwdM < 0,
    tmExtrapolated: outsideBevisFit(temperatureC),
  };
}

/** Input sigmas the series path always defaults (stored met carries none). */
const SERIES_DEFAULTED: readonly string[] = ['pressure_sigma_hpa', 'temperature_sigma_k'];

interface BudgetInput {
  zwdM: number;
  /** σ of the delay [m]; undefined: unknown. */
  delaySigmaM: number | undefined;
  /** The ZHD subtracted from a total delay [m], or null when ZWD was given. */
  splitZhdM: number | null;
  pressureSigmaHpa: number;
  tmK: number;
  tmSigmaK: number;
  /** σ of the surface temperature behind a Bevis Tm [K]; 0 when Tm is the caller's. */
  temperatureSigmaK: number;
  latitudeRad: number;
  heightM: number;
}

/**
 * PWV = Π(Tm)·ZWD (Bevis et al. 1994) and its budget: the numeric core of both functions above.
 *   delay        Π σ_delay
 *   pressure     Π ∂ZHD/∂P σ_P                     (ZWD from a total delay only)
 *   zhd_model    Π ZHD σ_c/c, c the Saastamoinen constant
 *   temperature  ZWD ∂Π/∂Tm · 0.72 σ_Ts            (Tm from Bevis only)
 *   tm           ZWD ∂Π/∂Tm σ_Tm
 *   refractivity ZWD σ_Π(k2', k3)
 * ZWD, σ [m]; Tm, σ [K]; Π [-]; PWV and the terms [mm].
 */
function pwvWithBudget(b: BudgetInput) {
  const pi = conversionFactor(b.tmK);
  const dPiDTm = conversionFactorPerKelvin(b.tmK);
  const absZwdM = Math.abs(b.zwdM);
  const pressureSigmaM = b.splitZhdM === null ? 0 : zenithHydrostaticDelayPerHpa(b.latitudeRad, b.heightM) * b.pressureSigmaHpa;
  const zhdModelSigmaM = b.splitZhdM === null ? 0 : b.splitZhdM * ZHD_MODEL_RELATIVE_SIGMA;
  const delaySigmaKnown = b.delaySigmaM !== undefined;
  const sigmaBudget = {
    delayMm: delaySigmaKnown ? pi * b.delaySigmaM! * 1000 : null,
    pressureMm: pi * pressureSigmaM * 1000,
    zhdModelMm: pi * zhdModelSigmaM * 1000,
    temperatureMm: absZwdM * dPiDTm * BEVIS_TM_SLOPE * b.temperatureSigmaK * 1000,
    tmMm: absZwdM * dPiDTm * b.tmSigmaK * 1000,
    refractivityMm: absZwdM * conversionFactorSigmaFromConstants(b.tmK) * 1000,
  };
  return {
    zwdM: b.zwdM,
    zwdSigmaM: rootSumSquare3(b.delaySigmaM ?? 0, pressureSigmaM, zhdModelSigmaM),
    conversionFactor: pi,
    pwvMm: pi * b.zwdM * 1000,
    pwvSigmaMm: rootSumSquare6(
      sigmaBudget.delayMm ?? 0,
      sigmaBudget.pressureMm,
      sigmaBudget.zhdModelMm,
      sigmaBudget.temperatureMm,
      sigmaBudget.tmMm,
      sigmaBudget.refractivityMm,
    ),
    delaySigmaKnown,
    sigmaBudget,
  };
}

/**
 * √(Σ xᵢ²) for the independent terms of a budget. Math.hypot with six arguments costs ~30× more in
 * V8 (it guards against overflow, which values of mm and m never reach) and ran once per record.
 */
const rootSumSquare3 = (a: number, b: number, c: number) => Math.sqrt(a * a + b * b + c * c);
const rootSumSquare6 = (a: number, b: number, c: number, d: number, e: number, f: number) =>
  Math.sqrt(a * a + b * b + c * c + d * d + e * e + f * f);

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
