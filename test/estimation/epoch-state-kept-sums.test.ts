import { describe, expect, it } from 'vitest';
import { buildDesign, setWeights, type Design } from '../../src/estimation/design.js';
import { EpochStateSolver } from '../../src/estimation/epoch-states.js';
import type { Solution } from '../../src/estimation/least-squares.js';
import { simulateSky } from '../helpers/realistic-sky.js';
import { skyInput } from '../helpers/synthetic-input.js';

/**
 * The block solver keeps each epoch's sums from one solution to the next and sums again only the
 * epochs whose used flags changed, or all of them after setWeights (epoch-states.ts). The reference
 * is an independent computation of the same solution: a fresh solver (no sums kept) on the same
 * design, flags and weights. Both must give the same doubles, bit for bit (common practice: a cache
 * must not change a result), in every array and sum the estimator reads.
 */

const gpsLikeDay = () => skyInput(simulateSky({ seed: 11, durationS: 86_400, grossErrors: 25, constellations: ['gps'] }));

/** The solution's arrays and sums, copied (a solver overwrites its arrays at the next solve). */
function snapshot(solution: Solution) {
  return {
    x: Float64Array.from(solution.x),
    diagonal: Float64Array.from(solution.inverse.diagonal),
    biasM: Float64Array.from(solution.biasM),
    fittedResidualM: Float64Array.from(solution.fittedResidualM),
    residualVarianceM2: Float64Array.from(solution.residualVarianceM2),
    epochNormal: Float64Array.from(solution.epochNormal),
    sums: [
      solution.weightedSquareSum,
      solution.observationSquareSum,
      solution.observationRedundancy,
      solution.residualSquareSumM2,
      solution.observationsUsed,
      solution.epochsUsed,
    ],
  };
}

function freshSolution(design: Design, options: Parameters<typeof buildDesign>[0]['options'], used: Uint8Array) {
  const solution = new EpochStateSolver(design, options).solve(used);
  expect(solution).not.toBeNull();
  return snapshot(solution!);
}

describe('block solver with the epoch sums kept between solutions, against a fresh solver', () => {
  it('after rejections in a few epochs, after a whole epoch is rejected and taken back, and after new weights', () => {
    const input = gpsLikeDay();
    const design = buildDesign(input);
    const n = design.residualM.length;
    const used = new Uint8Array(n).fill(1);
    const kept = new EpochStateSolver(design, input.options);
    const steps: Array<[string, () => void]> = [
      ['first solution', () => {}],
      ['nothing changed', () => {}],
      [
        'three observations rejected in three epochs',
        () => {
          for (const s of [5, Math.floor(n / 2), n - 3]) used[s] = 0;
        },
      ],
      ['every observation of epoch 100 rejected', () => used.fill(0, design.epochStart[100]!, design.epochStart[101]!)],
      ['epoch 100 taken back', () => used.fill(1, design.epochStart[100]!, design.epochStart[101]!)],
      ['new weights (elevation-dependent 4 mm)', () => setWeights(design, 0, 0.004, 1)],
      ['new weights with the same flags again', () => setWeights(design, 0.001, 0.003, 1)],
    ];
    let changedEpochNormals = 0;
    let previous: ReturnType<typeof snapshot> | null = null;
    for (const [name, change] of steps) {
      change();
      const solution = kept.solve(used);
      expect(solution, name).not.toBeNull();
      const got = snapshot(solution!);
      const fresh = freshSolution(design, input.options, used);
      for (const key of Object.keys(fresh) as Array<keyof typeof fresh>) {
        // The first entry that is not the same double (Object.is: NaN equals NaN, 0 is not −0); −1 when none.
        const a = got[key];
        const b = fresh[key];
        const first = a.length !== b.length ? 0 : Array.prototype.findIndex.call(a, (v: number, i: number) => !Object.is(v, b[i]));
        expect(first, `${name}: ${key}`).toBe(-1);
      }
      // The steps do change the system (so that the comparison can fail when stale sums are kept).
      if (previous && got.epochNormal.some((v, i) => !Object.is(v, previous!.epochNormal[i]))) changedEpochNormals++;
      previous = got;
    }
    expect(changedEpochNormals).toBe(steps.length - 2);
  });
});
