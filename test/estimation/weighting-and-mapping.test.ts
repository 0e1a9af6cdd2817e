import { describe, expect, it } from 'vitest';
import { gaussian, mulberry32 } from '../../scripts/synthetic-residuals.js';
import { ModelDomainError } from '../../src/domain/errors.js';
import { estimateZwd } from '../../src/estimation/estimate.js';
import type { ZwdEstimationOptions, ZwdEstimationOutput } from '../../src/estimation/types.js';
import { simulateSky, type Sky } from '../helpers/realistic-sky.js';
import { REALISTIC_OPTIONS as DEFAULTS, skyInput } from '../helpers/synthetic-input.js';
import { DEG, MM } from '../helpers/units.js';

/**
 * Issue 10 items 2 and 3 and the node layout of item 5: elevation-dependent weighting with
 * estimated components, the residual diagnostics per elevation band, screening reported per
 * band, the wet mapping function of the caller's choice, nodes on round UTC epochs.
 * Data: test/helpers/realistic-sky.ts (seeded, independent of src/), white noise unless stated.
 */

function estimate(sky: Sky, options: Partial<ZwdEstimationOptions> = {}): ZwdEstimationOutput {
  return estimateZwd(skyInput(sky, options));
}

const band = (out: ZwdEstimationOutput, lowerDeg: number) =>
  out.statistics.elevationBands.find((b) => Math.abs(b.lowerRad - lowerDeg * DEG) < 1e-9)!;
const rmsError = (sky: Sky, out: ZwdEstimationOutput) =>
  Math.sqrt(out.epochs.reduce((s, e) => s + (e.correctionM - sky.zwdAt(e.epochMs)) ** 2, 0) / out.epochs.length);

describe('weighting σ² = a² + b²/sin²e with a and b estimated (variance components; simulator truth a = 4 mm, b = 3 mm)', () => {
  const sky = simulateSky({ seed: 4, sigmaConstantM: 4 * MM, correlatedShare: 0, grossErrors: 30 });
  const components = estimate(sky, { weighting: 'elevation-components' });
  const elevationOnly = estimate(sky, { weighting: 'elevation' });

  it('recovers a and b to 5 % (the simulator’s truth)', () => {
    expect(components.statistics.weightingConstantM / (4 * MM)).toBeGreaterThan(0.95);
    expect(components.statistics.weightingConstantM / (4 * MM)).toBeLessThan(1.05);
    expect(components.statistics.weightingElevationM / (3 * MM)).toBeGreaterThan(0.95);
    expect(components.statistics.weightingElevationM / (3 * MM)).toBeLessThan(1.05);
    expect(components.warnings).toEqual([]);
  });

  it('the band diagnostic: normalised residual RMS ≈ 1 in every band with the fitted components, not with σ0/sin e alone', () => {
    for (const b of components.statistics.elevationBands) {
      expect(b.normalisedRms!).toBeGreaterThan(0.95);
      expect(b.normalisedRms!).toBeLessThan(1.05);
    }
    // σ0/sin e fitted to the same data overrates the low and underrates the high elevations.
    expect(band(elevationOnly, 7).normalisedRms!).toBeLessThan(0.85);
    expect(band(elevationOnly, 60).normalisedRms!).toBeGreaterThan(1.15);
    // ... and rejects more clean observations at high elevations.
    expect(band(elevationOnly, 60).observationsRejected).toBeGreaterThan(band(components, 60).observationsRejected + 5);
  });

  it('the bands add up to the observations used and rejected', () => {
    const s = components.statistics;
    expect(s.elevationBands.reduce((n, b) => n + b.observationsUsed, 0)).toBe(s.observationsUsed);
    expect(s.elevationBands.reduce((n, b) => n + b.observationsRejected, 0)).toBe(s.observationsRejected);
  });
});

describe('screening reports what it did per elevation band (noise at 7–10° three times what the weights say)', () => {
  const sky = simulateSky({ seed: 5, correlatedShare: 0, grossErrors: 0 });
  const normal = gaussian(mulberry32(55));
  sky.elevationRad.forEach((e, i) => {
    if (e < 10 * DEG) sky.residualM[i]! += 3 * ((3 * MM) / Math.sin(e)) * normal();
  });
  const out = estimate(sky);

  it('the 7–10° band shows it: normalised RMS above 1.5, and a warning names the band', () => {
    const low = band(out, 7);
    expect(low.normalisedRms!).toBeGreaterThan(1.5);
    expect(low.observationsRejected).toBeGreaterThan(0.02 * (low.observationsUsed + low.observationsRejected));
    expect(out.warnings.join(' ')).toMatch(/at 7–10°/);
  });
});

describe('wet mapping function of the caller’s choice: VMF1 with per-epoch coefficients (Boehm, Werl & Schuh 2006)', () => {
  // Nearly noiseless data (σ0 = 0.01 mm) mapped with VMF1, aw rising from 0.00050 to 0.00066 over
  // the day: what is left of the ZWD error is the mapping model's.
  const sky = simulateSky({ seed: 6, correlatedShare: 0, grossErrors: 0, sigma0M: 0.01 * MM, vmf1Aw: [0.0005, 0.00066] });
  const start = Date.parse(sky.options.startIso);
  const hours = [0, 6, 12, 18, 24];
  const coefficients = {
    epochMs: hours.map((h) => start + h * 3_600_000),
    ah: hours.map(() => 0.0012),
    aw: hours.map((h) => 0.0005 + (0.00016 * h) / 24),
  };

  it('VMF1 with the coefficients recovers the truth to the noise level (< 0.01 mm); Niell leaves > 0.05 mm', () => {
    const vmf1 = estimate(sky, { wetMapping: { model: 'vmf1', coefficients } });
    const niell = estimate(sky);
    expect(rmsError(sky, vmf1)).toBeLessThan(0.01 * MM);
    expect(rmsError(sky, niell)).toBeGreaterThan(0.05 * MM);
  });

  it('VMF1 without coefficients: 400 naming the option', () => {
    let err: unknown;
    try {
      estimate(sky, { wetMapping: { model: 'vmf1' } });
    } catch (e) {
      err = e;
    }
    expect(err).toBeInstanceOf(ModelDomainError);
    expect((err as ModelDomainError).status).toBe(400);
    expect((err as ModelDomainError).field).toBe('options.wet_mapping.coefficients');
  });
});

describe('nodes on round UTC epochs (issue 10 item 5)', () => {
  it('data from 00:02:30 to 05:57:30: 300-s nodes at 00:00, 00:05, … 06:00; 1-h gradient nodes on the hour', () => {
    const sky = simulateSky({
      seed: 7,
      durationS: 6 * 3600 - 300,
      startIso: '2026-06-21T00:02:30Z',
      gap: null,
      grossErrors: 0,
      correlatedShare: 0,
    });
    const out = estimate(sky, { gradients: { ...DEFAULTS.gradients!, intervalS: 3600 } });
    expect(new Date(out.zwdNodes[0]!.epochMs).toISOString()).toBe('2026-06-21T00:00:00.000Z');
    expect(new Date(out.zwdNodes.at(-1)!.epochMs).toISOString()).toBe('2026-06-21T06:00:00.000Z');
    expect(out.zwdNodes.length).toBe(73);
    expect(out.zwdNodes.every((n) => n.epochMs % 300_000 === 0)).toBe(true);
    expect(out.gradientNodes.map((g) => new Date(g.epochMs).toISOString().slice(11, 19))).toEqual([
      '00:00:00',
      '01:00:00',
      '02:00:00',
      '03:00:00',
      '04:00:00',
      '05:00:00',
      '06:00:00',
    ]);
    expect(out.statistics.zwdNodesWithoutData).toBe(0);
  });
});
