/**
 * Random estimation results for the answer writers' byte-for-byte and decoded-equality tests (fast-check):
 * numbers of every kind JSON.stringify and Arrow write differently (exponents, -0, subnormals, the largest
 * double, NaN and ±Infinity), nulls where a field may be absent, any text (binary, graphemes) in warnings,
 * satellites, met states and the fingerprint, tables of any length up to a few rows (empty included).
 * The rest of the result (statistics, models, options) is `base`'s.
 */

import fc from 'fast-check';
import type { ZwdEstimationResult } from '../../src/services/zwd-estimation.js';

const anyNumber = fc.oneof(
  fc.double(),
  fc.double({ min: -1e3, max: 1e3, noNaN: true }),
  fc.constantFrom(0, -0, 1e21, 1e-7, 5e-324, -1.7976931348623157e308, 0.1 + 0.2, NaN, Infinity, -Infinity),
  fc.integer(),
);
const anyNullable = fc.option(anyNumber, { nil: null });
const anyText = fc.oneof(fc.string(), fc.string({ unit: 'binary' }), fc.string({ unit: 'grapheme' }));
const anyEpochMs = fc.integer({ min: 0, max: 4_102_444_800_000 });

const node = fc.record({ epochMs: anyEpochMs, correctionM: anyNumber, sigmaM: anyNumber, observationsNearby: fc.nat() });
const gradientNode = fc.record({
  epochMs: anyEpochMs,
  northM: anyNumber,
  eastM: anyNumber,
  northSigmaM: anyNumber,
  eastSigmaM: anyNumber,
  observationsNearby: fc.nat(),
});
const epochRow = fc.record({
  epoch: fc.record({
    epochMs: anyEpochMs,
    correctionM: anyNumber,
    sigmaM: anyNumber,
    northGradientM: anyNullable,
    eastGradientM: anyNullable,
    northGradientSigmaM: anyNullable,
    eastGradientSigmaM: anyNullable,
    epochBiasM: anyNullable,
    observationsUsed: fc.nat(),
  }),
  zwd: fc.record({ zwdM: anyNumber, zhdM: anyNumber, zhdSource: fc.oneof(fc.constantFrom('met', 'met-bridged'), anyText) }),
  met: fc.record({
    met: fc.oneof(fc.constantFrom('measured', 'interpolated', 'missing'), anyText),
    zhdM: anyNullable,
    zwdM: anyNullable,
    tmK: anyNullable,
    pwvMm: anyNullable,
    pwvSigmaMm: anyNullable,
    pwvTotalSigmaMm: anyNullable,
  }),
});
const rejection = fc.record({
  index: fc.nat(),
  epochMs: anyEpochMs,
  satellite: anyText,
  residualM: anyNumber,
  fittedResidualM: anyNumber,
  normalizedResidual: anyNumber,
});

/** Results shaped as `base` (a real estimation's statistics and models) with random tables and values. */
export function anyZwdEstimationResult(base: ZwdEstimationResult): fc.Arbitrary<ZwdEstimationResult> {
  return fc
    .record({
      nodes: fc.array(node, { maxLength: 5 }),
      gradients: fc.array(gradientNode, { maxLength: 5 }),
      epochs: fc.array(epochRow, { maxLength: 8 }),
      withMet: fc.boolean(),
      rejected: fc.array(rejection, { maxLength: 4 }),
      aprioriZhdM: anyNumber,
      aprioriZwdM: anyNumber,
      warnings: fc.array(anyText, { maxLength: 3 }),
      fingerprint: anyText,
    })
    .map(
      (g) =>
        ({
          ...base,
          estimate: {
            ...base.estimate,
            zwdNodes: g.nodes,
            gradientNodes: g.gradients,
            epochs: g.epochs.map((e) => e.epoch),
            rejected: g.rejected,
          },
          aprioriZhdM: g.aprioriZhdM,
          aprioriZwdM: g.aprioriZwdM,
          epochZwd: g.epochs.map((e) => e.zwd),
          epochMet: g.withMet ? g.epochs.map((e) => e.met) : null,
          modelFingerprint: g.fingerprint,
          warnings: g.warnings.map((text) => ({ code: 'met-missing', text })),
        }) as unknown as ZwdEstimationResult,
    );
}
