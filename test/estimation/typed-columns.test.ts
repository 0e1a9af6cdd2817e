/**
 * Issue 14, typed estimator input: the estimator takes its observation columns as Float64Arrays (σ NaN where
 * the caller gave none) as well as arrays (σ null), and the HTTP adapters hand it the JSON reader's columns
 * without a copy. A change of representation only: the reference is the estimator given the same observations
 * as arrays (whose outputs test/estimation/unchanged-results.test.ts pins to the digests of an older commit),
 * bit for bit (the SHA-256 digests of test/helpers/estimation-digests.ts), common practice for a speed change.
 */

import { describe, expect, it } from 'vitest';
import { DEG } from '../../src/domain/constants.js';
import { satelliteName } from '../../src/estimation/design.js';
import { estimateZwd } from '../../src/estimation/estimate.js';
import { ModelDomainError } from '../../src/domain/errors.js';
import type { IndexedSatellites, TypedEstimationInput, ZwdEstimationInput } from '../../src/estimation/types.js';
import { readJsonColumnsBody } from '../../src/formats/json-columns-reader.js';
import { observationsFromJsonColumns, typedObservationsFromJsonColumns } from '../../src/http/adapters/zwd-estimation.js';
import { columnSpecsOf, jsonColumnSpecsOf } from '../../src/http/columns.js';
import { zwdObservationSchema } from '../../src/http/schemas/zwd-estimates.js';
import { MAX_OBSERVATIONS } from '../../src/limits.js';
import { outputDigest } from '../helpers/estimation-digests.js';
import { simulateSky } from '../helpers/realistic-sky.js';
import { skyInput, toEstimationInput } from '../helpers/synthetic-input.js';
import { generateSyntheticResiduals } from '../../scripts/synthetic-residuals.js';

/** The same observations in Float64Arrays, built here element by element (σ: null → NaN). */
function typedInput(input: ZwdEstimationInput): TypedEstimationInput {
  const o = input.observations;
  const column = (values: readonly number[]) => {
    const out = new Float64Array(values.length);
    for (let i = 0; i < values.length; i++) out[i] = values[i]!;
    return out;
  };
  let sigmaM: Float64Array | undefined;
  if (o.sigmaM) {
    sigmaM = new Float64Array(o.sigmaM.length);
    for (let i = 0; i < sigmaM.length; i++) sigmaM[i] = o.sigmaM[i] === null ? Number.NaN : o.sigmaM[i]!;
  }
  return {
    ...input,
    observations: {
      epochMs: column(o.epochMs),
      satellite: [...o.satellite],
      elevationRad: column(o.elevationRad),
      azimuthRad: column(o.azimuthRad),
      residualM: column(o.residualM),
      sigmaM,
    },
  };
}

/** The GPS-like day with its observations in reverse order (the estimator sorts them by epoch). */
function reversed(input: ZwdEstimationInput): ZwdEstimationInput {
  const o = input.observations;
  return {
    ...input,
    observations: {
      epochMs: [...o.epochMs].reverse(),
      satellite: [...o.satellite].reverse(),
      elevationRad: [...o.elevationRad].reverse(),
      azimuthRad: [...o.azimuthRad].reverse(),
      residualM: [...o.residualM].reverse(),
    },
  };
}

describe('typed observation columns give the outputs of array columns, bit for bit (digests)', () => {
  const gps = skyInput(simulateSky({ seed: 11, durationS: 86_400, grossErrors: 25, constellations: ['gps'] }));
  const generated = generateSyntheticResiduals({ durationS: 6 * 3600, latitudeDeg: 46.2 });
  const withSigmas = toEstimationInput(generated, 46.2, { scaleSigmas: true }, true);
  const aThirdWithout: ZwdEstimationInput = {
    ...withSigmas,
    observations: { ...withSigmas.observations, sigmaM: withSigmas.observations.sigmaM!.map((s, k) => (k % 3 === 0 ? null : s)) },
  };
  const cases: Record<string, ZwdEstimationInput> = {
    'GPS-like day, defaults': gps,
    'GPS-like day, out of epoch order': reversed(gps),
    "generated day, caller's sigmas": withSigmas,
    "generated day, a third without caller's sigmas (NaN in the typed column)": aThirdWithout,
  };
  for (const [name, input] of Object.entries(cases)) {
    it(
      name,
      () => {
        expect(outputDigest(estimateZwd(typedInput(input)))).toBe(outputDigest(estimateZwd(input)));
      },
      30_000,
    );
  }
});

describe('typedObservationsFromJsonColumns gives the values of observationsFromJsonColumns', () => {
  const SPECS = jsonColumnSpecsOf(columnSpecsOf(zwdObservationSchema.shape));
  const body = {
    observations: {
      epoch: ['2026-03-01T00:00:00Z', '2026-03-01T00:00:00Z', '2026-03-01T00:00:30Z'],
      satellite: ['G01', 'G02', 'G01'],
      elevation_deg: [12.5, 70, 12.75],
      azimuth_deg: [10, 200.25, 11],
      residual_m: [0.012, -0.003, 0.0115],
      sigma_m: [0.004, null, 0.0045],
    },
  };
  const read = (b: unknown) =>
    readJsonColumnsBody(new Uint8Array(Buffer.from(JSON.stringify(b))), 'observations', SPECS, MAX_OBSERVATIONS)!;

  it('with σ on some rows: the same numbers, σ NaN where the array has null', () => {
    const arrays = observationsFromJsonColumns(read(body));
    const typed = typedObservationsFromJsonColumns(read(body));
    expect(typed.epochMs).toBeInstanceOf(Float64Array);
    expect(Array.from(typed.epochMs)).toEqual(arrays.epochMs);
    expect(Array.from(arrays.satellite, (_, i) => satelliteName(typed.satellite, i))).toEqual(arrays.satellite);
    expect(Array.from(typed.elevationRad)).toEqual(arrays.elevationRad);
    expect(Array.from(typed.azimuthRad)).toEqual(arrays.azimuthRad);
    expect(Array.from(typed.residualM)).toEqual(arrays.residualM);
    expect(Array.from(typed.sigmaM!, (v) => (Number.isNaN(v) ? null : v))).toEqual(arrays.sigmaM);
    // Degrees to radians as Date.parse and DEG give them (from memory: 12.5° = 0.2181661564992912 rad).
    expect(typed.elevationRad[0]).toBe(12.5 * DEG);
    expect(typed.elevationRad[0]).toBeCloseTo(0.2181661564992912, 15);
    expect(typed.epochMs[2]).toBe(Date.parse('2026-03-01T00:00:30Z'));
  });

  it('without any σ: no σ column', () => {
    const none = { observations: { ...body.observations, sigma_m: [null, null, null] } };
    expect(observationsFromJsonColumns(read(none)).sigmaM).toBeUndefined();
    expect(typedObservationsFromJsonColumns(read(none)).sigmaM).toBeUndefined();
  });
});

/**
 * The satellites as indices into names (as the JSON reader gives them): `names` in reverse order of first
 * appearance (so the indices are not the numbers the design gives), and with `twice` every name listed a second
 * time, odd observations pointing at the second listing.
 */
function indexedSatellites(satellite: readonly string[], twice = false): IndexedSatellites {
  const distinct = [...new Set(satellite)].reverse();
  const names = twice ? [...distinct, ...distinct] : distinct;
  const at = new Map(distinct.map((name, k) => [name, k]));
  const index = Uint32Array.from(satellite, (name, i) => at.get(name)! + (twice && i % 2 === 1 ? distinct.length : 0));
  return { index, names };
}

describe('satellites as indices into names give the outputs of names, bit for bit (digests)', () => {
  const gps = skyInput(simulateSky({ seed: 11, durationS: 86_400, grossErrors: 25, constellations: ['gps'] }));
  const withIndices = (input: ZwdEstimationInput, twice = false): TypedEstimationInput => {
    const typed = typedInput(input);
    return { ...typed, observations: { ...typed.observations, satellite: indexedSatellites(input.observations.satellite, twice) } };
  };

  it('GPS-like day, names not in order of first appearance', () => {
    expect(outputDigest(estimateZwd(withIndices(gps)))).toBe(outputDigest(estimateZwd(gps)));
  }, 30_000);

  it('GPS-like day, every name listed twice (one satellite each)', () => {
    expect(outputDigest(estimateZwd(withIndices(gps, true)))).toBe(outputDigest(estimateZwd(gps)));
  }, 30_000);

  it('a duplicate (epoch, satellite) through two listings of one name is still refused, named as with names', () => {
    const o = gps.observations;
    // Observation 1 made a second observation of observation 0's satellite at its epoch.
    const duplicated = { ...gps, observations: { ...o, epochMs: [...o.epochMs], satellite: [...o.satellite] } };
    duplicated.observations.epochMs[1] = o.epochMs[0]!;
    duplicated.observations.satellite[1] = o.satellite[0]!;
    const refusal = (input: ZwdEstimationInput | TypedEstimationInput) => {
      try {
        estimateZwd(input);
      } catch (err) {
        if (err instanceof ModelDomainError) return `${err.status} ${err.field} ${err.message}`;
        throw err;
      }
      throw new Error('expected a refusal');
    };
    const expected = refusal(duplicated);
    expect(expected).toMatch(/^400 observations\.1 duplicate observation/);
    expect(refusal(withIndices(duplicated, true))).toBe(expected);
  });
});
