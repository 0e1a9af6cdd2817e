import { describe, expect, it } from 'vitest';
import { GRADIENT_MODELS } from '../../src/domain/gradients/gradient-mapping.js';
import { elevationSines } from '../../src/domain/mapping/elevation-sines.js';
import { MAPPING_MODELS } from '../../src/domain/mapping/registry.js';
import { allocateSlantBatch, computeSlantDelays } from '../../src/domain/slant.js';
import { slantDigests } from '../helpers/slant-digests.js';

/**
 * The slant path's batch loops take sin e computed once per direction (elevationSines) instead of each model
 * calling Math.sin again. That may not move a bit of any answer of /v1/slant-delays or /v1/mapping-factors.
 *
 * Expected: the digests (test/helpers/slant-digests.ts: SHA-256 of the output columns' float64 bytes) of the
 * code before that change, main at de20892, recorded by running the same cases against that tree. Chao and
 * the cosecant do not depend on the site, so their three sites share a digest. A digest that differs means
 * a factor or a delay moved: compare the columns of the two trees to find which. (A newer Node whose Math.sin,
 * Math.tan or Math.cos rounds differently would move them too; then record again at the commit before.)
 */
const BEFORE_SHARED_SINES: Record<string, string> = {
  'niell + chen-herring, φ 47°, 400 m, day 172.3, site coefficients, gradients':
    '4354523a421fbf17706a01e866856c2d1633e29ead21f9af69b85327c3826ae8',
  'niell + chen-herring, φ 47°, 400 m, day 172.3, site coefficients, no gradients':
    '04db48d3e343a824628490ca4b958342bfbf57ee761d36bcfd3020fe6ed684e6',
  'niell + chen-herring, φ −63°, 1.2 km, day 300.5, sea-level coefficients, gradients':
    '4a5a2d58a53fa59155046ccab01d5fc071ee78ae5d833ebfedfdb5c61218a8df',
  'niell + chen-herring, φ −63°, 1.2 km, day 300.5, sea-level coefficients, no gradients':
    '45cf1c139317ae5fb8d46aaddca34dcf1e009ff22178f6ec8edef1078781de2b',
  'niell + chen-herring, φ 5°, −20 m, day 1, sea-level coefficients, gradients':
    '219a541201c6e348c8e06d7c5c74470fd0d4f9dd8e8a2e7c6675c5a251cd31ac',
  'niell + chen-herring, φ 5°, −20 m, day 1, sea-level coefficients, no gradients':
    '09086c904b18a79f621aa28371707c6e1f0476d0c4ee4833a4f511d0f354e485',
  'niell + tilting, φ 47°, 400 m, day 172.3, site coefficients, gradients':
    'a5aaff408adbb1a11c66b58149375933bf165c0060c1b30cdb10bc32c2b72eb4',
  'niell + tilting, φ 47°, 400 m, day 172.3, site coefficients, no gradients':
    '3ee036f8bdbb9b7556bc041e3afd2bfa9c281d6b05c3eecdd568a12e8ae3167f',
  'niell + tilting, φ −63°, 1.2 km, day 300.5, sea-level coefficients, gradients':
    'a15aa9bfed8044a4bacd7714f2d1075a3f8c51582cb6e7c5cd40ddeb7beb5b30',
  'niell + tilting, φ −63°, 1.2 km, day 300.5, sea-level coefficients, no gradients':
    '9f41c0c7bc1d6ca8d78ad2c1f3234c59a0d8fb5c5fdd999584bf8a4c9953dbde',
  'niell + tilting, φ 5°, −20 m, day 1, sea-level coefficients, gradients':
    '50bec45b58919154171757c5271b2a40f5efba5d7786e0061c8417f4a8b69a2f',
  'niell + tilting, φ 5°, −20 m, day 1, sea-level coefficients, no gradients':
    'f4d9089920b3bca860fa2395b44382edfeba227b7b239ff9705299f4df430974',
  'vmf1 + chen-herring, φ 47°, 400 m, day 172.3, site coefficients, gradients':
    '953ab05f074e1064100ffac439cd16b2a7798b56ba018a717b0248d75ceee0f6',
  'vmf1 + chen-herring, φ 47°, 400 m, day 172.3, site coefficients, no gradients':
    '561fd3be0482052ac2a9f56d6cbbaeb1c5addf59e91880b84d846bd79049f0bf',
  'vmf1 + chen-herring, φ −63°, 1.2 km, day 300.5, sea-level coefficients, gradients':
    '749ba36ab4afb913c74e157eaa23e7152f5008897b431c20d137d71ea2e2807d',
  'vmf1 + chen-herring, φ −63°, 1.2 km, day 300.5, sea-level coefficients, no gradients':
    'b3b7946983da79100724f7d5edd99fcccdf885cc98e7e1f670135d47b2df7111',
  'vmf1 + chen-herring, φ 5°, −20 m, day 1, sea-level coefficients, gradients':
    '4dd6abed86b972178e76dc9fda3d4e01d0f308d987b7cd189b1599db82db90a7',
  'vmf1 + chen-herring, φ 5°, −20 m, day 1, sea-level coefficients, no gradients':
    '3908cc0ac8f9b7bc162781d9ddc0799221c5a9515edf55150094c1eea653f943',
  'vmf1 + tilting, φ 47°, 400 m, day 172.3, site coefficients, gradients':
    '35f3e90200580dfc2dfe7211eccbbef31359cd9c63e6a86ecceeb28567c0decc',
  'vmf1 + tilting, φ 47°, 400 m, day 172.3, site coefficients, no gradients':
    'c5993320ef0b32844a67a592c8d7ad4d6fc6a90e5d2a99a645203301289ff8cd',
  'vmf1 + tilting, φ −63°, 1.2 km, day 300.5, sea-level coefficients, gradients':
    'ca9b0de5fcf33daa522127855d027a859132e18481809e8e7ed9fbde0757ffb9',
  'vmf1 + tilting, φ −63°, 1.2 km, day 300.5, sea-level coefficients, no gradients':
    '89d8be5745273270cb2a4371716586ae00c46153204863c6b8b568c97a95d7b4',
  'vmf1 + tilting, φ 5°, −20 m, day 1, sea-level coefficients, gradients':
    'df94aa5c34372d5e98a36480fb9f4d66699e803d93569607e075b85ebdbf53c5',
  'vmf1 + tilting, φ 5°, −20 m, day 1, sea-level coefficients, no gradients':
    '67d64003b0bef67b2be4ef57e70a3810434ac5cc844acc4f267142ba125af46d',
  'chao + chen-herring, φ 47°, 400 m, day 172.3, site coefficients, gradients':
    '42207d6595b8f9e0bf9b3e46ee964b2550c9577279c059a891c207b3ba13bf51',
  'chao + chen-herring, φ 47°, 400 m, day 172.3, site coefficients, no gradients':
    '3823b5ae042680e2d7965743d8188767fb2eec464b491d7faac14c396404e882',
  'chao + chen-herring, φ −63°, 1.2 km, day 300.5, sea-level coefficients, gradients':
    '42207d6595b8f9e0bf9b3e46ee964b2550c9577279c059a891c207b3ba13bf51',
  'chao + chen-herring, φ −63°, 1.2 km, day 300.5, sea-level coefficients, no gradients':
    '3823b5ae042680e2d7965743d8188767fb2eec464b491d7faac14c396404e882',
  'chao + chen-herring, φ 5°, −20 m, day 1, sea-level coefficients, gradients':
    '42207d6595b8f9e0bf9b3e46ee964b2550c9577279c059a891c207b3ba13bf51',
  'chao + chen-herring, φ 5°, −20 m, day 1, sea-level coefficients, no gradients':
    '3823b5ae042680e2d7965743d8188767fb2eec464b491d7faac14c396404e882',
  'chao + tilting, φ 47°, 400 m, day 172.3, site coefficients, gradients':
    'ff5c2203bc21a652c8fbb5dedad531ef019c147d0f9d76ffc9cbd6abd4e19808',
  'chao + tilting, φ 47°, 400 m, day 172.3, site coefficients, no gradients':
    '9dd16adc965c37a8a91e706a3f74484647520d96fdf8cf9150378918c3b2e61e',
  'chao + tilting, φ −63°, 1.2 km, day 300.5, sea-level coefficients, gradients':
    'ff5c2203bc21a652c8fbb5dedad531ef019c147d0f9d76ffc9cbd6abd4e19808',
  'chao + tilting, φ −63°, 1.2 km, day 300.5, sea-level coefficients, no gradients':
    '9dd16adc965c37a8a91e706a3f74484647520d96fdf8cf9150378918c3b2e61e',
  'chao + tilting, φ 5°, −20 m, day 1, sea-level coefficients, gradients':
    'ff5c2203bc21a652c8fbb5dedad531ef019c147d0f9d76ffc9cbd6abd4e19808',
  'chao + tilting, φ 5°, −20 m, day 1, sea-level coefficients, no gradients':
    '9dd16adc965c37a8a91e706a3f74484647520d96fdf8cf9150378918c3b2e61e',
  'cosecant + chen-herring, φ 47°, 400 m, day 172.3, site coefficients, gradients':
    'e54fc3a220a49a77dfde8d5fe58c0555f9252ec5c74b06d403e101821770e247',
  'cosecant + chen-herring, φ 47°, 400 m, day 172.3, site coefficients, no gradients':
    '02091b8a7727e9ec19d56ef2410adf87203074b7d7ad83920703bc118f54b410',
  'cosecant + chen-herring, φ −63°, 1.2 km, day 300.5, sea-level coefficients, gradients':
    'e54fc3a220a49a77dfde8d5fe58c0555f9252ec5c74b06d403e101821770e247',
  'cosecant + chen-herring, φ −63°, 1.2 km, day 300.5, sea-level coefficients, no gradients':
    '02091b8a7727e9ec19d56ef2410adf87203074b7d7ad83920703bc118f54b410',
  'cosecant + chen-herring, φ 5°, −20 m, day 1, sea-level coefficients, gradients':
    'e54fc3a220a49a77dfde8d5fe58c0555f9252ec5c74b06d403e101821770e247',
  'cosecant + chen-herring, φ 5°, −20 m, day 1, sea-level coefficients, no gradients':
    '02091b8a7727e9ec19d56ef2410adf87203074b7d7ad83920703bc118f54b410',
  'cosecant + tilting, φ 47°, 400 m, day 172.3, site coefficients, gradients':
    '90f152047b74fa71d14261da1ae439535d3de01363ba5e343f37542026afef3f',
  'cosecant + tilting, φ 47°, 400 m, day 172.3, site coefficients, no gradients':
    '6ffe08c881664891f4345799024de608c8aa05bc1a4a43565f1449e4968706ed',
  'cosecant + tilting, φ −63°, 1.2 km, day 300.5, sea-level coefficients, gradients':
    '90f152047b74fa71d14261da1ae439535d3de01363ba5e343f37542026afef3f',
  'cosecant + tilting, φ −63°, 1.2 km, day 300.5, sea-level coefficients, no gradients':
    '6ffe08c881664891f4345799024de608c8aa05bc1a4a43565f1449e4968706ed',
  'cosecant + tilting, φ 5°, −20 m, day 1, sea-level coefficients, gradients':
    '90f152047b74fa71d14261da1ae439535d3de01363ba5e343f37542026afef3f',
  'cosecant + tilting, φ 5°, −20 m, day 1, sea-level coefficients, no gradients':
    '6ffe08c881664891f4345799024de608c8aa05bc1a4a43565f1449e4968706ed',
};

describe('slant delays unchanged by the shared sin e (digests of main at de20892)', () => {
  const digests = slantDigests({
    mappingModels: MAPPING_MODELS,
    gradientModels: GRADIENT_MODELS,
    computeSlantDelays,
    allocateSlantBatch: (n) => ({ ...allocateSlantBatch(n) }),
  });

  it('every recorded case is computed (4 mapping × 2 gradient models, 3 sites, with and without gradients)', () => {
    // A model added later is checked against its single form in mapping.test.ts; these pin the models of de20892.
    expect(Object.keys(BEFORE_SHARED_SINES)).toHaveLength(48);
    expect(Object.keys(BEFORE_SHARED_SINES).filter((name) => digests[name] === undefined)).toEqual([]);
  });

  for (const [name, expected] of Object.entries(BEFORE_SHARED_SINES)) {
    it(name, () => expect(digests[name]).toBe(expected));
  }
});

describe('elevationSines: Math.sin of each elevation, bit for bit', () => {
  it('equals Math.sin at every 0.01° from 0° to 90° and at odd elevations (Object.is)', () => {
    const elevationsRad = Float64Array.from([
      ...Array.from({ length: 9001 }, (_, i) => (i / 100) * (Math.PI / 180)),
      1e-300,
      1.5,
      Math.PI / 2,
    ]);
    const sines = elevationSines(elevationsRad, new Float64Array(elevationsRad.length));
    elevationsRad.forEach((e, i) => expect(Object.is(sines[i], Math.sin(e)), `at ${e} rad`).toBe(true));
  });
});
