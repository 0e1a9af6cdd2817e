import { describe, expect, it } from 'vitest';
import { buildDesign } from '../../src/estimation/design.js';
import { estimateZwd } from '../../src/estimation/estimate.js';
import { estimateNetwork } from '../../src/estimation/network/estimate-network.js';
import { digestCases, namedPerHour, outputDigest } from '../helpers/estimation-digests.js';
import { simulateSky } from '../helpers/realistic-sky.js';
import { skyInput } from '../helpers/synthetic-input.js';

/**
 * Issue 14, the estimator's bytes per observation: the design keeps no copy of the elevations, one column of
 * variances instead of weights and sigmas, no caller's-σ column when no σ was sent, satellite indices in the
 * narrowest integer array and no index arrays of all observations; the block solver writes Z_k over S_k⁻¹ and
 * x_k over u_k; the correlated-noise step packs epoch indices instead of epoch times. None of it may move a
 * bit of any result.
 *
 * Expected: the digests (test/helpers/estimation-digests.ts: SHA-256 of the whole output, numbers bit for
 * bit) of the code before those changes, commit bbb0200, recorded by running the same cases against that
 * tree. A digest that differs means a result moved: compare the outputs of the two trees to find which.
 * (A newer Node whose Math.sin or Math.exp rounds differently would move them too; then record again at the
 * commit before, as described in the helper.)
 */
const BEFORE_BBB0200: Record<string, string> = {
  'GPS-like day, defaults': 'dbcca257aa3344a06e7f31cb3dec1b4da6a5e27412457e92e3a0d5405d953003',
  'four-constellation day, defaults': '923569fcd4828a6381b2dbb786f931037ef5536d832a2a0defe3f6ae8d5779c0',
  'GPS-like day, one-per-solution screening': '6d1501e64306400255d53fa8fffeb794f09c7db8718fd51c334b598d304a8774',
  'GPS-like day, elevation-components': 'caddfc048b63f37b38ff741fbc4b90e614e739f1e45be364b4c9cfe2ed5ab3c6',
  'GPS-like day, uniform weights': 'da923bf6584468b1661b9422ff3929c16031fc6c2d619a82ebb9b6f09b957749',
  'GPS-like day, nodes': '878576fea14cb984e738d764e7fd63dca57ff116150e5720279e050732791d9b',
  'GPS-like day, no gradients': 'd5775d79ff769ac51444fb5baadbb32335e586ba0a7cea3c5ae64cb264f3d976',
  'GPS-like day, no epoch biases': '3ccc7c4cf417dcabd849352aef830eaaa167c717ad99c0e2eb690e59468777ff',
  'GPS-like day, out of epoch order': 'ff02eee8424f20dc9e00c51c11e6f7df4412c9da45fe8ccd3c24f57ba6f815f3',
  'GPS-like day, a satellite name per hour (more than 256 names)': 'cbe7bf49bf07fc7e697b47644475afc6b282b832570822a990ab9c139aa7edee',
  'generated day, no sigmas': '2edbe564e023769c43eebd191b600930af9e4f0d6a1037454283c3e2a6ebf77e',
  "generated day, caller's sigmas": '0ef65db4098f967c27b2733409c6fc5b16a81919f1390dc58c70e92bca7eca36',
  "generated day, caller's sigmas, elevation-components": '57a3c5520cbb201b82a3b677654ad6271419e0115f92526d6fd8dd86576a9acd',
  "generated day, a third without caller's sigmas": 'c55370e10e15391f055defca5e760c4a9a038e311fd8698899a3484dde8db8aa',
  'network of three, nodes, gross errors': '73cf0a9312bbc1c52af2bc0e76dcbef25e34d5b96ed46f45f55724f3d54cd47e',
  "network of two, every epoch, correlated noise, caller's sigmas": '3a9bd1c078baf80d0836b1e6c25721a31a825823858516ecead2a8185ed976db',
};

describe('estimator outputs bit for bit as before the memory changes (digests of commit bbb0200)', () => {
  const cases = digestCases(estimateZwd, estimateNetwork);

  it('covers every recorded case', () => {
    expect(Object.keys(cases).sort()).toEqual(Object.keys(BEFORE_BBB0200).sort());
  });

  for (const [name, run] of Object.entries(cases)) {
    it(
      name,
      () => {
        expect(outputDigest(run())).toBe(BEFORE_BBB0200[name]);
      },
      30_000,
    );
  }

  it('the satellite indices take one byte up to 256 satellites, two above (both paths are among the cases)', () => {
    const gps = skyInput(simulateSky({ seed: 11, durationS: 86_400, grossErrors: 25, constellations: ['gps'] }));
    expect(buildDesign(gps).satelliteIndex).toBeInstanceOf(Uint8Array);
    const perHour = buildDesign(namedPerHour(gps));
    expect(perHour.satelliteCount).toBeGreaterThan(256);
    expect(perHour.satelliteIndex).toBeInstanceOf(Uint16Array);
  });

  it('a digest moves with the last bit of one number', () => {
    // 0.1 and the next double above it (one unit in the last place): the serialisation keeps them apart.
    const bits = new DataView(new ArrayBuffer(8));
    bits.setFloat64(0, 0.1);
    bits.setBigUint64(0, bits.getBigUint64(0) + 1n);
    const nextUp = bits.getFloat64(0);
    expect(nextUp).toBeGreaterThan(0.1);
    expect(outputDigest({ correctionM: [0.1, Number.NaN] })).not.toBe(outputDigest({ correctionM: [nextUp, Number.NaN] }));
  });
});
