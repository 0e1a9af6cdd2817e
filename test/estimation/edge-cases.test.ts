import { describe, expect, it } from 'vitest';
import { generateSyntheticResiduals } from '../../scripts/synthetic-residuals.js';
import { ModelDomainError } from '../../src/domain/errors.js';
import { estimateZwd } from '../../src/estimation/estimate.js';
import type { ZwdEstimationInput } from '../../src/estimation/types.js';
import { denseZwdEstimate } from '../helpers/dense-estimation.js';
import { toEstimationInput } from '../helpers/synthetic-input.js';
import { M } from '../helpers/units.js';

const LATITUDE_DEG = 46.2;
const SAME_M = 1e-6 * M;
const H = 3600;

function thrown(f: () => unknown): ModelDomainError {
  try {
    f();
  } catch (err) {
    if (err instanceof ModelDomainError) return err;
    throw err;
  }
  throw new Error('expected a ModelDomainError');
}

describe('a single epoch (issue: one node when there is a single epoch)', () => {
  const data = generateSyntheticResiduals({ durationS: 0, latitudeDeg: LATITUDE_DEG });
  const input = toEstimationInput(data, LATITUDE_DEG, { scaleSigmas: false, correlatedNoise: false, outlierThreshold: null });
  const out = estimateZwd(input);

  it('has one ZWD node and one gradient node, at the epoch, and one series entry', () => {
    expect(out.zwdNodes.length).toBe(1);
    expect(out.gradientNodes.length).toBe(1);
    expect(out.epochs.length).toBe(1);
    expect(out.zwdNodes[0]!.epochMs).toBe(data.observations.epochMs[0]);
    expect(out.epochs[0]!.correctionM).toBe(out.zwdNodes[0]!.correctionM);
    expect(out.epochs[0]!.sigmaM).toBeCloseTo(out.zwdNodes[0]!.sigmaM, 15);
  });

  it('equals the dense solution (biases as unknowns)', () => {
    const dense = denseZwdEstimate(input);
    expect(Math.abs(out.zwdNodes[0]!.correctionM - dense.zwdNodesM[0]!)).toBeLessThan(SAME_M);
    expect(Math.abs(out.zwdNodes[0]!.sigmaM - dense.zwdNodeSigmaM[0]!)).toBeLessThan(SAME_M);
    expect(Math.abs(out.gradientNodes[0]!.northM - dense.northNodesM[0]!)).toBeLessThan(SAME_M);
    expect(out.statistics.degreesOfFreedom).toBe(dense.degreesOfFreedom);
  });
});

describe('a gap of several hours', () => {
  // 10 h of data with nothing from 3 h to 7 h.
  // 300 s sampling keeps the dense reference (a state per epoch) small.
  const data = generateSyntheticResiduals({ durationS: 10 * H, samplingS: 300, latitudeDeg: LATITUDE_DEG, gaps: [[3 * H, 7 * H]] });
  const input = toEstimationInput(data, LATITUDE_DEG, { scaleSigmas: false, correlatedNoise: false, outlierThreshold: null });
  const out = estimateZwd(input);
  const t0 = data.observations.epochMs[0]!;
  const at = (hours: number) => out.zwdNodes.find((n) => n.epochMs === t0 + hours * H * 1000)!;

  it('keeps the nodes in the gap (constrained by the random walk only) and no series entries there', () => {
    expect(out.zwdNodes.length).toBe(121);
    expect(out.epochs.some((e) => e.epochMs > t0 + 3 * H * 1000 && e.epochMs < t0 + 7 * H * 1000)).toBe(false);
  });

  it('sigma grows into the gap and is largest in its middle: q √(Δt) of a random walk bridged from both ends', () => {
    const outside = at(1).sigmaM;
    expect(at(4).sigmaM).toBeGreaterThan(3 * outside);
    expect(at(5).sigmaM).toBeGreaterThan(at(4).sigmaM);
    expect(at(5).sigmaM).toBeGreaterThan(at(6).sigmaM);
    // Brownian bridge over T = 4 h: σ(mid) = q √(T/4) = 0.01 m/√h · 1 √h = 10 mm (plus the end-point errors, common practice).
    expect(at(5).sigmaM).toBeGreaterThan(0.0095);
    expect(at(5).sigmaM).toBeLessThan(0.011);
  });

  it('in the gap the estimate is the straight line between the edges (random-walk smoothing)', () => {
    const a = at(3).correctionM;
    const b = at(7).correctionM;
    expect(at(5).correctionM).toBeCloseTo((a + b) / 2, 9);
  });

  it('equals the dense solution', () => {
    const dense = denseZwdEstimate(input);
    out.zwdNodes.forEach((n, j) => {
      expect(Math.abs(n.correctionM - dense.zwdNodesM[j]!)).toBeLessThan(SAME_M);
      expect(Math.abs(n.sigmaM - dense.zwdNodeSigmaM[j]!)).toBeLessThan(SAME_M);
    });
  });
});

describe('bad input and a system that cannot be solved', () => {
  const base = () =>
    toEstimationInput(generateSyntheticResiduals({ durationS: 2 * H, samplingS: 120, latitudeDeg: LATITUDE_DEG }), LATITUDE_DEG);

  it('duplicate (epoch, satellite): 400 naming both observations', () => {
    const input = base();
    const o = input.observations;
    o.epochMs.push(o.epochMs[3]!);
    o.satellite.push(o.satellite[3]!);
    o.elevationRad.push(0.5);
    o.azimuthRad.push(1);
    o.residualM.push(0);
    const err = thrown(() => estimateZwd(input));
    expect(err.status).toBe(400);
    expect(err.field).toBe(`observations.${o.epochMs.length - 1}`);
    expect(err.message).toMatch(/also observations\.3/);
  });

  it('a duplicate below the cutoff is still a duplicate', () => {
    const input = base();
    const o = input.observations;
    o.epochMs.push(o.epochMs[0]!, o.epochMs[0]!);
    o.satellite.push('X99', 'X99');
    o.elevationRad.push(0.02, 0.03);
    o.azimuthRad.push(1, 2);
    o.residualM.push(0, 0);
    expect(thrown(() => estimateZwd(input)).status).toBe(400);
  });

  it('nothing at or above the cutoff: 422 stating the cutoff', () => {
    const input = base();
    input.options.elevationCutoffRad = (89 * Math.PI) / 180;
    const err = thrown(() => estimateZwd(input));
    expect(err.status).toBe(422);
    expect(err.message).toMatch(/89\.00°/);
  });

  it('too many nodes for the span: 400 naming the interval option', () => {
    const input = base();
    input.options.zwd.intervalS = 0.01;
    const err = thrown(() => estimateZwd(input));
    expect(err.status).toBe(400);
    expect(err.field).toBe('options.zwd_interval_s');
  });

  it('a node in a gap without random-walk or a-priori constraints: 422 naming the node and saying why', () => {
    const data = generateSyntheticResiduals({ durationS: 3 * H, samplingS: 120, latitudeDeg: LATITUDE_DEG, gaps: [[1 * H, 2 * H]] });
    const input = toEstimationInput(data, LATITUDE_DEG, {
      zwd: { intervalS: 600, randomWalkMPerSqrtH: null, aprioriSigmaM: null },
      gradients: null,
      parametrisation: 'nodes',
    });
    const err = thrown(() => estimateZwd(input));
    expect(err.status).toBe(422);
    expect(err.field).toBe('observations');
    expect(err.message).toMatch(/zenith wet delay node 7 at 2026-03-14T01:10:00\.000Z is not determined: no observation touches it/);
    expect(err.message).toMatch(/zwd_random_walk_m_per_sqrt_h is null/);
  });

  it('one satellite per epoch with epoch biases and no constraints: the ZWD cannot be told from the bias (422)', () => {
    const data = generateSyntheticResiduals({ durationS: 1 * H, samplingS: 120, latitudeDeg: LATITUDE_DEG });
    const o = data.observations;
    const first = new Map<number, number>();
    o.epochMs.forEach((t, i) => first.has(t) || first.set(t, i));
    const keep = [...first.values()];
    const single = {
      ...data,
      observations: {
        epochMs: keep.map((i) => o.epochMs[i]!),
        satellite: keep.map((i) => o.satellite[i]!),
        elevationDeg: keep.map((i) => o.elevationDeg[i]!),
        azimuthDeg: keep.map((i) => o.azimuthDeg[i]!),
        residualM: keep.map((i) => o.residualM[i]!),
        sigmaM: keep.map((i) => o.sigmaM[i]!),
      },
    };
    const input = toEstimationInput(single, LATITUDE_DEG, {
      zwd: { intervalS: 600, randomWalkMPerSqrtH: null, aprioriSigmaM: null },
      gradients: null,
      elevationCutoffRad: 0,
    });
    const err = thrown(() => estimateZwd(input));
    expect(err.status).toBe(422);
    expect(err.message).toMatch(/zenith wet delay node 0 .* observations touch it, but they do not separate it .* epoch_bias/);
    // With the default constraints the same data are solvable: the a-priori constraint decides,
    // and with one observation per epoch there are no degrees of freedom.
    const constrained = estimateZwd({
      ...input,
      options: { ...input.options, zwd: { intervalS: 600, randomWalkMPerSqrtH: 0.01, aprioriSigmaM: 0.5 } },
    });
    expect(constrained.statistics.degreesOfFreedom).toBe(0);
    expect(constrained.statistics.varianceFactor).toBeNull();
    expect(constrained.zwdNodes[0]!.sigmaM).toBeCloseTo(0.5, 6); // the a-priori σ: the data add nothing
    expect(constrained.warnings.join(' ')).toMatch(/no degrees of freedom/);
  });
});

describe('screening limits', () => {
  it('stops at max_rejections with a warning and screening_complete false', () => {
    const data = generateSyntheticResiduals({ durationS: 4 * H, latitudeDeg: LATITUDE_DEG, grossErrors: 8 });
    const input: ZwdEstimationInput = toEstimationInput(data, LATITUDE_DEG, { maxRejections: 3 });
    const out = estimateZwd(input);
    expect(out.rejected.length).toBe(3);
    expect(out.statistics.screeningComplete).toBe(false);
    expect(out.warnings.join(' ')).toMatch(/stopped after 3 rejections/);
  });

  // Variance-component estimation (issue 10): scale_sigmas re-estimates the observation weights
  // and re-solves; the random-walk prior keeps its stated q, so a wrong sigma0 neither shrinks nor
  // inflates what the random walk alone determines.
  it('scale_sigmas re-estimates σ0 from the residuals (data with 6 mm, option 3 mm) and gives the σ of the right σ0', () => {
    const data = generateSyntheticResiduals({ durationS: 2 * H, latitudeDeg: LATITUDE_DEG, sigma0M: 0.006 });
    const input = toEstimationInput(data, LATITUDE_DEG, { outlierThreshold: null, correlatedNoise: false });
    const scaled = estimateZwd({ ...input, options: { ...input.options, scaleSigmas: true } });
    const right = estimateZwd({ ...input, options: { ...input.options, scaleSigmas: false, sigma0M: 0.006 } });
    // σ0 of the generator: 6 mm; the estimate from ~5000 residuals is good to a few per cent.
    expect(scaled.statistics.weightingElevationM).toBeGreaterThan(0.006 * 0.95);
    expect(scaled.statistics.weightingElevationM).toBeLessThan(0.006 * 1.05);
    expect(scaled.statistics.varianceFactor!).toBeGreaterThan(0.9);
    expect(scaled.statistics.varianceFactor!).toBeLessThan(1.1);
    expect(scaled.statistics.solutions).toBeGreaterThan(1);
    scaled.zwdNodes.forEach((n, j) => expect(Math.abs(n.sigmaM / right.zwdNodes[j]!.sigmaM - 1)).toBeLessThan(0.05));
  });

  it('a σ0 too large (10 mm on 3 mm data) does not shrink σ inside a 4-h gap (the random walk keeps its q)', () => {
    const data = generateSyntheticResiduals({ durationS: 10 * H, samplingS: 120, latitudeDeg: LATITUDE_DEG, gaps: [[3 * H, 7 * H]] });
    const input = toEstimationInput(data, LATITUDE_DEG, { outlierThreshold: null, correlatedNoise: false, gradients: null });
    const wrong = estimateZwd({ ...input, options: { ...input.options, scaleSigmas: true, sigma0M: 0.01 } });
    const right = estimateZwd({ ...input, options: { ...input.options, scaleSigmas: false, sigma0M: 0.003 } });
    const mid = Date.parse('2026-03-14T05:00:00Z');
    const a = wrong.zwdNodes.find((n) => n.epochMs === mid)!;
    const b = right.zwdNodes.find((n) => n.epochMs === mid)!;
    // Brownian bridge over 4 h with q = 10 mm/√h: 10 mm in the middle (common practice).
    expect(b.sigmaM).toBeGreaterThan(0.0095);
    expect(Math.abs(a.sigmaM / b.sigmaM - 1)).toBeLessThan(0.02);
    expect(a.observationsNearby).toBe(0);
    expect(wrong.statistics.zwdNodesWithoutData).toBeGreaterThan(30);
  });
});
