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

import { CallerError } from './caller-error.js';
import { warning, type Warning } from './warnings.js';

export const RESIDUAL_MAD_LIMIT_M = 1;
/** A ZWD below −10 mm over the series (median) is not weather: the residuals' sign is likely reversed. */
export const NEGATIVE_ZWD_LIMIT_M = -0.01;

const median = (v: number[]): number => {
  const s = [...v].sort((a, b) => a - b);
  const n = s.length;
  return n === 0 ? Number.NaN : n % 2 ? s[(n - 1) / 2]! : (s[n / 2 - 1]! + s[n / 2]!) / 2;
};

/**
 * Refuses residuals that look like millimetres (or another unit a thousand times too small): 400
 * naming `observations` with what was measured and how to fix it.
 * @param epochMs epoch of each observation [ms]; @param residualM residual [m, as sent]
 */
export function guardResidualUnit(epochMs: readonly number[], residualM: readonly number[]): void {
  const byEpoch = new Map<number, number[]>();
  epochMs.forEach((t, i) => {
    const list = byEpoch.get(t);
    if (list) list.push(residualM[i]!);
    else byEpoch.set(t, [residualM[i]!]);
  });
  const deviations: number[] = [];
  for (const list of byEpoch.values()) {
    if (list.length < 2) continue;
    const m = median(list);
    for (const r of list) deviations.push(Math.abs(r - m));
  }
  if (deviations.length < 10) return;
  const mad = median(deviations);
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
export function negativeZwdWarning(zwdM: readonly number[]): Warning | null {
  const m = median(zwdM.filter(Number.isFinite));
  if (!(m < NEGATIVE_ZWD_LIMIT_M)) return null;
  return warning(
    'zwd-negative',
    `the estimated ZWD is ${(m * 1000).toFixed(1)} mm (median over the series), below ${NEGATIVE_ZWD_LIMIT_M * 1000} mm: a ZWD is never negative; residual_m may have the opposite sign (send observed − computed)`,
  );
}
