import { describe, expect, it } from 'vitest';
import {
  generateSyntheticResiduals,
  truthEastAt,
  truthNorthAt,
  truthZwdAt,
  type SyntheticOptions,
} from '../../scripts/synthetic-residuals.js';
import { estimateZwd } from '../../src/estimation/estimate.js';
import { toEstimationInput } from '../helpers/synthetic-input.js';

/**
 * Recovery of a known truth from the committed generator (scripts/synthetic-residuals.ts): a
 * GNSS-like sky (26 560 km, 55°, half a sidereal day, six planes), a random-walk ZWD and gradient
 * truth drawn with the same q the estimator assumes, ±300 km epoch biases and σ0/sin(e) noise.
 * When the formal errors are honest, (estimate − truth)/σ has unit RMS ("normalised error RMS
 * near 1"; common practice). Its sampling spread is about 1/√(2 n_eff), with n_eff roughly the
 * number of nodes (neighbouring epochs are correlated), hence the bounds below.
 */
const LATITUDE_DEG = 46.2;
const GRADIENT_INTERVAL_S = 7200;

function recover(overrides: Partial<SyntheticOptions>) {
  const synthetic: Partial<SyntheticOptions> = {
    durationS: 86_400,
    latitudeDeg: LATITUDE_DEG,
    gradients: { intervalS: GRADIENT_INTERVAL_S, randomWalkMPerSqrtH: 0.001, initialM: 0.0006, initialEastM: -0.0004 },
    ...overrides,
  };
  const data = generateSyntheticResiduals(synthetic);
  const input = toEstimationInput(data, LATITUDE_DEG, {
    gradients: { intervalS: GRADIENT_INTERVAL_S, randomWalkMPerSqrtH: 0.001, aprioriSigmaM: 0.01 },
    scaleSigmas: false,
    // The generator's truth is piecewise linear between 300 s nodes: the "nodes" model is exact for it.
    parametrisation: 'nodes',
  });
  return { data, input, output: estimateZwd(input) };
}

const rms = (xs: number[]) => Math.sqrt(xs.reduce((s, x) => s + x * x, 0) / xs.length);

describe('recovery of a synthetic random-walk truth within the formal errors (scripts/synthetic-residuals.ts)', () => {
  const { data, output } = recover({ seed: 3 });

  it('ZWD at the nodes and at every epoch: normalised error RMS near 1', () => {
    const nodeErrors = output.zwdNodes.map((n) => (n.correctionM - truthZwdAt(data.truth, n.epochMs)) / n.sigmaM);
    const epochErrors = output.epochs.map((e) => (e.correctionM - truthZwdAt(data.truth, e.epochMs)) / e.sigmaM);
    expect(output.zwdNodes.length).toBe(289); // 24 h / 300 s + 1
    expect(rms(nodeErrors)).toBeGreaterThan(0.8);
    expect(rms(nodeErrors)).toBeLessThan(1.2);
    expect(rms(epochErrors)).toBeGreaterThan(0.8);
    expect(rms(epochErrors)).toBeLessThan(1.2);
    // And the errors are small in absolute terms: a few mm (common practice for 30 s data).
    expect(rms(output.epochs.map((e) => e.sigmaM))).toBeLessThan(0.003);
  });

  it('gradients at the nodes: normalised error RMS near 1 (26 values, so wider bounds)', () => {
    const errors = output.gradientNodes.flatMap((g) => [
      (g.northM - truthNorthAt(data.truth, g.epochMs)) / g.northSigmaM,
      (g.eastM - truthEastAt(data.truth, g.epochMs)) / g.eastSigmaM,
    ]);
    expect(errors.length).toBe(26);
    expect(rms(errors)).toBeGreaterThan(0.6);
    expect(rms(errors)).toBeLessThan(1.4);
  });

  it('epoch biases of hundreds of kilometres come back to the noise level', () => {
    const biasErrors = output.epochs.map((e) => e.epochBiasM! - data.truth.biasM.get(e.epochMs)!);
    expect(Math.max(...data.truth.biasM.values())).toBeGreaterThan(250_000);
    expect(rms(biasErrors)).toBeLessThan(0.01); // m
  });

  it('variance factor near 1 (noise as assumed): within 4 × √(2/f)', () => {
    const f = output.statistics.degreesOfFreedom;
    expect(Math.abs(output.statistics.varianceFactor! - 1)).toBeLessThan(4 * Math.sqrt(2 / f));
  });

  it('drops and counts the observations below the 7° cutoff (the generator goes down to 3°)', () => {
    const below = data.observations.elevationDeg.filter((e) => e < 7).length;
    expect(below).toBeGreaterThan(0);
    expect(output.statistics.observationsBelowCutoff).toBe(below);
    expect(output.statistics.observationsUsed + output.statistics.observationsRejected + below).toBe(data.observations.epochMs.length);
  });
});

describe('injected gross errors are flagged (12–20 σ, generator)', () => {
  const { data, input, output } = recover({ seed: 8, grossErrors: 12 });

  it('every injected error is rejected, with at most a couple of false alarms at k = 4', () => {
    const rejected = new Set(output.rejected.map((r) => r.index));
    for (const i of data.grossErrorIndices) expect(rejected.has(i)).toBe(true);
    // False alarms: P(|τ| > 4) ≈ 6e-5 per observation for Gaussian noise (normal tables), ~1.3 per 20 000.
    expect(output.rejected.length - data.grossErrorIndices.length).toBeLessThanOrEqual(4);
    for (const r of output.rejected) expect(Math.abs(r.normalizedResidual)).toBeGreaterThan(4);
  });

  it('the one-per-window mode rejects what the one-at-a-time loop rejects, with fewer solutions', () => {
    const strict = estimateZwd({ ...input, options: { ...input.options, outlierRejection: 'one-per-solution' } });
    expect(new Set(output.rejected.map((r) => r.index))).toEqual(new Set(strict.rejected.map((r) => r.index)));
    expect(output.statistics.solutions).toBeLessThan(strict.statistics.solutions);
    output.zwdNodes.forEach((n, j) => expect(n.correctionM).toBeCloseTo(strict.zwdNodes[j]!.correctionM, 9));
  });

  it('without screening the gross errors bias the estimate (so the screening matters)', () => {
    const unscreened = estimateZwd({ ...input, options: { ...input.options, outlierThreshold: null } });
    expect(unscreened.rejected).toEqual([]);
    expect(unscreened.statistics.varianceFactor!).toBeGreaterThan(output.statistics.varianceFactor! + 0.1);
  });
});
