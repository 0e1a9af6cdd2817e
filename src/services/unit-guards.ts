/**
 * Guards against inputs in the wrong unit (issue 10, item 4), in domain shapes: refuse where the
 * result would be meaningless, warn where the input may be intended.
 *
 * Thresholds from the physics (common practice, from memory): a zenith wet delay is 0..~0.5 m, so
 * after the a-priori troposphere the residual of one satellite differs from the others of its epoch
 * by at most ZWD error × (m(e) − m(e')) ≈ 0.5 × (8.2 − 1.5) ≈ 3.4 m at a 7° cut-off (Niell wet mapping
 * ≈ 8.2 at 7°), and the median absolute such difference is a fraction of a metre. A median absolute
 * deviation from the epoch median above RESIDUAL_MAD_LIMIT_M = 1 m is therefore not a delay in
 * metres; residuals in millimetres give ~10² "m". The epoch median removes receiver clocks.
 */

import { medianInPlace } from '../estimation/order-statistics.js';
import { CallerError } from './caller-error.js';
import { warning, type Warning } from './warnings.js';

export const RESIDUAL_MAD_LIMIT_M = 1;
/** A ZWD below −10 mm over the series (median) is not weather: the residuals' sign is likely reversed. */
export const NEGATIVE_ZWD_LIMIT_M = -0.01;

/**
 * Median of the finite values, in their order (NaN when there are none): copied straight into a typed array,
 * so that no array of boxed numbers is made on the way (issue 14: a filtered array per request).
 */
function finiteMedian(v: ArrayLike<number>): number {
  const finite = new Float64Array(v.length);
  let count = 0;
  for (let i = 0; i < v.length; i++) {
    const x = v[i]!;
    if (Number.isFinite(x)) finite[count++] = x;
  }
  return medianInPlace(finite, count);
}

/**
 * Refuses residuals that look like millimetres (or another unit a thousand times too small): 400
 * naming `observations` with what was measured and how to fix it.
 * @param epochMs epoch of each observation [ms]; @param residualM residual [m, as sent]
 */
export function guardResidualUnit(epochMs: Float64Array | readonly number[], residualM: Float64Array | readonly number[]): void {
  const n = epochMs.length;
  // The observations grouped by epoch: in input order when the epochs are sorted (the usual case: no copy at
  // all), else copied in the order of a sort on the epoch (the order within an epoch does not change a median).
  // Typed arrays and no list per epoch: this runs on every estimation request (a day of 30 s data has ~3 000
  // epochs).
  let sorted = true;
  for (let i = 1; i < n && sorted; i++) sorted = epochMs[i - 1]! <= epochMs[i]!;
  let epochs = epochMs;
  let residuals = residualM;
  if (!sorted) {
    const order = new Int32Array(n);
    for (let i = 0; i < n; i++) order[i] = i;
    order.sort((a, b) => epochMs[a]! - epochMs[b]!);
    const sortedEpochs = new Float64Array(n);
    const sortedResiduals = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      sortedEpochs[i] = epochMs[order[i]!]!;
      sortedResiduals[i] = residualM[order[i]!]!;
    }
    epochs = sortedEpochs;
    residuals = sortedResiduals;
  }
  const group = new Float64Array(n);
  const deviations = new Float64Array(n);
  let count = 0;
  for (let a = 0; a < n;) {
    const t = epochs[a]!;
    let b = a + 1;
    while (b < n && epochs[b] === t) b++;
    if (b - a >= 2) {
      for (let k = a; k < b; k++) group[k - a] = residuals[k]!;
      const m = medianInPlace(group, b - a);
      for (let k = a; k < b; k++) deviations[count++] = Math.abs(residuals[k]! - m);
    }
    a = b;
  }
  if (count < 10) return;
  const mad = medianInPlace(deviations, count);
  if (mad > RESIDUAL_MAD_LIMIT_M) {
    throw CallerError.field(
      400,
      'observations',
      `residual_m spreads by ${mad.toPrecision(3)} m (median absolute deviation from each epoch's median) where a tropospheric residual spreads by at most ~${RESIDUAL_MAD_LIMIT_M} m: ` +
        'the residuals look like millimetres; send residual_m (and sigma_m) in metres',
    );
  }
}

/** A warning when the estimated ZWD series is clearly negative (median below NEGATIVE_ZWD_LIMIT_M). */
export function negativeZwdWarning(zwdM: ArrayLike<number>): Warning | null {
  const m = finiteMedian(zwdM);
  if (!(m < NEGATIVE_ZWD_LIMIT_M)) return null;
  return warning(
    'zwd-negative',
    `the estimated ZWD is ${(m * 1000).toFixed(1)} mm (median over the series), below ${NEGATIVE_ZWD_LIMIT_M * 1000} mm: a ZWD is never negative; residual_m may have the opposite sign (send observed − computed)`,
  );
}

// ---------------------------------------------------------------------------------------------
// Relative humidity sent as a fraction, angles sent in radians (issue 10, item 4).
//
// The rules, documented in docs/zwd-estimation.md ("Unit guards"):
// - relative humidity: every value given is ≤ RH_FRACTION_LIMIT_PCT (1.5) and one is above 0 →
//   a warning naming the field ("percent expected"). A relative humidity of 1.5 % or less
//   everywhere is possible (a desert afternoon, a polar winter: common practice) but rare, so the
//   value is used as sent and the caller is told.
// - elevations: at least MIN_DIRECTIONS_FOR_ANGLE_GUARD values, all ≤ π/2 = 1.5708 (the largest
//   elevation in radians): in degrees every direction would lie within 1.6° of the horizon. Refused
//   where the answer would be meaningless (any value below the 1° floor of the mapping functions in
//   the a-priori routes, which they refuse anyway; in an estimation every observation would be
//   below any useful cut-off), a warning otherwise (a low-elevation table in degrees may be meant).
// - azimuths: at least MIN_DIRECTIONS_FOR_ANGLE_GUARD values, all within [0, 2π] = [0, 6.2832] and
//   spread by more than 1 (radians spanning more than 57°): in degrees every direction would lie
//   within 6.3° of north. A warning (the zenith delays do not depend on azimuth; gradients do).

/** Relative humidities all at or below this [%] look like fractions 0..1 (a little margin for RH > 1). */
export const RH_FRACTION_LIMIT_PCT = 1.5;
/** Fewer directions than this never trigger the angle guards (one or two low directions in degrees are plausible). */
export const MIN_DIRECTIONS_FOR_ANGLE_GUARD = 3;
const HALF_PI = Math.PI / 2;
const TWO_PI = 2 * Math.PI;
/** Radians carry no more than 1e-4 of rounding here: 1.5708 is π/2 to five digits. */
const ANGLE_ROUNDING = 1e-4;

/**
 * @param field the API field, e.g. "met.relative_humidity_pct" or "records.*.relative_humidity_pct"
 * @param valuesPct relative humidities as sent (null/NaN: not given) [%]
 */
export function relativeHumidityUnitWarning(field: string, valuesPct: readonly (number | null)[]): Warning | null {
  let n = 0;
  let max = Number.NEGATIVE_INFINITY;
  for (const v of valuesPct) {
    if (v === null || Number.isNaN(v)) continue;
    n++;
    if (v > max) max = v;
  }
  if (n === 0 || !(max > 0) || max > RH_FRACTION_LIMIT_PCT) return null;
  const what = n === 1 ? `${field} is ${max}` : `all ${n} values of ${field} are ≤ ${RH_FRACTION_LIMIT_PCT} (largest ${max})`;
  return warning(
    'humidity-looks-like-fraction',
    `${what}: percent expected (0..100); a fraction 0..1 gives a vapour pressure about 100 times too small. Used as sent; multiply by 100 if it is a fraction`,
  );
}

/** What the angle guards found: a refusal (CallerError thrown) or warnings. */
export interface AngleGuardContext {
  /** Field that names the directions in messages, e.g. "directions", "elevations_deg", "observations". */
  field: string;
  /** true: elevations that look like radians are refused (an estimation, or any below the mapping floor). */
  refuseElevations: boolean;
}

const max = (v: ArrayLike<number>) => {
  let m = Number.NEGATIVE_INFINITY;
  for (let i = 0; i < v.length; i++) if (v[i]! > m) m = v[i]!;
  return m;
};
const min = (v: ArrayLike<number>) => {
  let m = Number.POSITIVE_INFINITY;
  for (let i = 0; i < v.length; i++) if (v[i]! < m) m = v[i]!;
  return m;
};

/**
 * Elevations [deg as sent] that look like radians: refused (400 naming the field) when
 * `context.refuseElevations`, else a warning; null when they do not look like radians.
 */
export function elevationUnitGuard(elevationsDeg: ArrayLike<number>, context: AngleGuardContext): Warning | null {
  if (elevationsDeg.length < MIN_DIRECTIONS_FOR_ANGLE_GUARD) return null;
  const largest = max(elevationsDeg);
  if (largest > HALF_PI + ANGLE_ROUNDING) return null;
  const text = `all ${elevationsDeg.length} elevations are ≤ π/2 = 1.5708 (largest ${largest}): they look like radians; elevation_deg is in degrees (0, 90]`;
  if (context.refuseElevations)
    throw CallerError.field(400, context.field, `${text}. In degrees every direction would be within 1.6° of the horizon; send degrees`);
  return warning('elevation-looks-like-radians', `${context.field}: ${text}; used as degrees (within 1.6° of the horizon)`);
}

/** Azimuths [deg as sent] that look like radians: a warning, or null. */
export function azimuthUnitWarning(azimuthsDeg: ArrayLike<number>, field: string): Warning | null {
  if (azimuthsDeg.length < MIN_DIRECTIONS_FOR_ANGLE_GUARD) return null;
  const largest = max(azimuthsDeg);
  const smallest = min(azimuthsDeg);
  if (largest > TWO_PI + ANGLE_ROUNDING || !(largest - smallest > 1)) return null;
  return warning(
    'azimuth-looks-like-radians',
    `${field}: all ${azimuthsDeg.length} azimuths are within [0, 2π] = [0, 6.2832] (from ${smallest} to ${largest}): they look like radians; azimuth_deg is in degrees [0, 360]. Used as degrees (every direction within 6.3° of north): gradients are wrong if they are radians`,
  );
}
