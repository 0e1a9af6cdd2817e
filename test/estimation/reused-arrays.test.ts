/**
 * The thread's reused arrays of the estimator (src/estimation/reused-arrays.ts): a result never sees a later
 * request's numbers, a thrown estimation leaves them usable, every array handed out is zero-filled, and the
 * thread keeps no more than its budget. The references are the results of the same inputs computed again
 * afterwards and (bit for bit) copies taken before anything else ran; test/estimation/unchanged-results.test.ts
 * compares the outputs with digests recorded before the arrays were reused.
 */

import { describe, expect, it } from 'vitest';
import { generateSyntheticResiduals } from '../../scripts/synthetic-residuals.js';
import { ModelDomainError } from '../../src/domain/errors.js';
import { estimateZwd } from '../../src/estimation/estimate.js';
import { FRESH_ARRAYS, ReusedArrays } from '../../src/estimation/reused-arrays.js';
import type { ZwdEstimationInput } from '../../src/estimation/types.js';
import { outputDigest } from '../helpers/estimation-digests.js';
import { simulateSky } from '../helpers/realistic-sky.js';
import { skyInput, toEstimationInput } from '../helpers/synthetic-input.js';

const LATITUDE_DEG = 46.2;
const H = 3600;

/** One satellite per epoch: with epoch biases and no a-priori constraint the ZWD level is not determined (422). */
function singularInput(): ZwdEstimationInput {
  const data = generateSyntheticResiduals({ durationS: 2 * H, samplingS: 120, latitudeDeg: LATITUDE_DEG });
  const o = data.observations;
  const first = new Map<number, number>();
  o.epochMs.forEach((t, i) => first.has(t) || first.set(t, i));
  const keep = [...first.values()];
  const pick = <T>(column: T[]) => keep.map((i) => column[i]!);
  const single = {
    ...data,
    observations: {
      epochMs: pick(o.epochMs),
      satellite: pick(o.satellite),
      elevationDeg: pick(o.elevationDeg),
      azimuthDeg: pick(o.azimuthDeg),
      residualM: pick(o.residualM),
      sigmaM: pick(o.sigmaM),
    },
  };
  return toEstimationInput(single, LATITUDE_DEG, {
    zwd: { intervalS: 600, randomWalkMPerSqrtH: 0.01, aprioriSigmaM: null },
    gradients: { intervalS: 3600, randomWalkMPerSqrtH: 0.001, aprioriSigmaM: null },
    parametrisation: 'every-epoch',
    elevationCutoffRad: 0,
  });
}

describe('the estimator with the thread’s reused arrays', () => {
  // A short generated day (fewer observations and epochs than the GPS-like day), the GPS-like day (the
  // benchmark request) and the short day with the caller's sigmas (another column in use).
  const generated = generateSyntheticResiduals({ durationS: 8 * H, latitudeDeg: LATITUDE_DEG });
  const small = () => toEstimationInput(generated, LATITUDE_DEG, { scaleSigmas: true });
  const withSigmas = () => toEstimationInput(generated, LATITUDE_DEG, { scaleSigmas: true }, true);
  const gps = () => skyInput(simulateSky({ seed: 11, durationS: 86_400, grossErrors: 25, constellations: ['gps'] }));

  it('a result is unchanged by the requests after it, and equals a fresh run of its input afterwards', () => {
    const first = estimateZwd(small());
    const firstCopy = structuredClone(first);
    const second = estimateZwd(gps());
    const secondCopy = structuredClone(second);
    const third = estimateZwd(withSigmas());
    // The requests differ, so a result holding a reused array would now hold another request's numbers.
    expect(outputDigest(first)).not.toBe(outputDigest(second));
    expect(outputDigest(third)).not.toBe(outputDigest(first));
    expect(outputDigest(first)).toBe(outputDigest(firstCopy));
    expect(outputDigest(second)).toBe(outputDigest(secondCopy));
    expect(outputDigest(estimateZwd(small()))).toBe(outputDigest(firstCopy));
    expect(outputDigest(estimateZwd(gps()))).toBe(outputDigest(secondCopy));
  });

  it('a thrown estimation (singular system, after the solver ran) leaves the arrays usable', () => {
    const before = outputDigest(estimateZwd(gps()));
    let thrown: unknown;
    try {
      estimateZwd(singularInput());
    } catch (err) {
      thrown = err;
    }
    expect(thrown).toBeInstanceOf(ModelDomainError);
    expect((thrown as ModelDomainError).status).toBe(422);
    expect(outputDigest(estimateZwd(gps()))).toBe(before);
  });
});

describe('ReusedArrays', () => {
  it('hands out zero-filled arrays of the asked length, reusing a role’s memory', () => {
    const arrays = new ReusedArrays(1 << 20);
    const a = arrays.float64('a', 1000);
    a.fill(7);
    const again = arrays.float64('a', 500);
    expect(again.length).toBe(500);
    expect(again.buffer).toBe(a.buffer);
    expect(again.every((v) => v === 0)).toBe(true);
    const asBytes = arrays.uint8('a', 10);
    expect(asBytes.buffer).toBe(a.buffer);
    expect([...asBytes]).toEqual(new Array(10).fill(0));
    for (const make of [(n: number) => arrays.int32('b', n), (n: number) => arrays.uint16('b', n)]) {
      make(33).fill(3);
      expect([...make(33)]).toEqual(new Array(33).fill(0));
    }
  });

  it('gives fresh arrays (not kept) beyond its budget, and grows a role within it', () => {
    const arrays = new ReusedArrays(256 * 1024);
    const kept = arrays.float64('kept', 1000);
    expect(arrays.held).toBe(64 * 1024);
    const tooLarge = arrays.float64('large', 40_000);
    expect(tooLarge.length).toBe(40_000);
    expect(arrays.held).toBe(64 * 1024);
    expect(arrays.float64('large', 40_000).buffer).not.toBe(tooLarge.buffer);
    const grown = arrays.float64('kept', 20_000);
    expect(grown.buffer).not.toBe(kept.buffer);
    expect(arrays.held).toBe(192 * 1024);
    expect(arrays.float64('kept', 20_000).buffer).toBe(grown.buffer);
  });

  it('FRESH_ARRAYS gives a new array every time', () => {
    expect(FRESH_ARRAYS.float64('x', 4).buffer).not.toBe(FRESH_ARRAYS.float64('x', 4).buffer);
  });
});
