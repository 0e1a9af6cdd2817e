/**
 * The column as thin spherical shells: the nodes between the shells carry pressure, temperature,
 * vapour pressure, gravity and refractivity; each shell carries the mean refractivities and
 * densities over its thickness. The zenith integrals (integrate.ts) and the ray tracer
 * (ray-trace.ts) work on the same shells, so a zenith trace reproduces the zenith integrals exactly
 * and mapping factors are ratios of like with like.
 *
 * - Node spacing inside the profile: h/20 at height h above the site, at least 10 m and at most
 *   200 m (divided by `resolution`), and every level of the profile is a node. Halving the spacing
 *   changes the mapping factor at 5° by less than 1e-5 (test/domain/profile/ray-trace.test.ts).
 * - Above the top: the nodes of the extension (extension.ts).
 * - Radii: r = R + h with R the Gaussian radius of curvature at the site (geometry/earth-radius.ts).
 * - Shell means: the hydrostatic refractivity is averaged as an exponential in height,
 *   (N1 − N2)/ln(N1/N2), exact for an exponential; wet quantities the same way where the vapour
 *   pressure is interpolated exponentially and arithmetically where it is interpolated linearly
 *   (levels.ts), exact for a linear profile at constant temperature.
 */

import { RV_J_PER_KG_K } from '../constants.js';
import { inverseCompressibilityDry, inverseCompressibilityWet } from './compressibility.js';
import { PER_N_UNIT } from './constants.js';
import type { Extension } from './extension.js';
import type { GravityAtLatitude } from './gravity.js';
import { interpolateInLayer, vapourExponential, type Column } from './levels.js';
import { hydrostaticRefractivity, wetRefractivity, type RefractivityConstants } from './refractivity.js';

export const SHELL_STEP_FRACTION_OF_HEIGHT = 1 / 20;
export const SHELL_STEP_MIN_M = 10;
export const SHELL_STEP_MAX_M = 200;

export interface ShellOptions {
  constants: RefractivityConstants;
  compressibility: boolean;
  gravity: GravityAtLatitude;
  earthRadiusM: number;
  /** 1 for the default spacing, 2 for half of it, … */
  resolution?: number;
}

export interface ShellColumn {
  /** Node arrays, bottom (the site) to ceiling, length = shells + 1. */
  heightM: Float64Array;
  radiusM: Float64Array;
  pressureHpa: Float64Array;
  temperatureK: Float64Array;
  vapourPressureHpa: Float64Array;
  gravityM_S2: Float64Array;
  /** Shell arrays, length = shells. Mean hydrostatic and wet refractivity [N-units]. */
  hydrostaticN: Float64Array;
  wetN: Float64Array;
  /** Mean refractive index of the shell, 1 + 1e-6 (N_h + N_w) [-]. */
  refractiveIndex: Float64Array;
  /** Mean water vapour density [kg/m³]. */
  vapourDensityKgM3: Float64Array;
  /** Means of e/T [hPa/K] and e/T² [hPa/K²] (for Tm). */
  eOverT: Float64Array;
  eOverT2: Float64Array;
  shells: number;
  /** Index of the node at the profile's top level (the extension lies above it). */
  topNode: number;
}

/** Node spacing at a height above the site [m]. */
export function shellStepM(heightAboveSiteM: number, resolution = 1): number {
  return Math.min(SHELL_STEP_MAX_M, Math.max(SHELL_STEP_MIN_M, heightAboveSiteM * SHELL_STEP_FRACTION_OF_HEIGHT)) / resolution;
}

/** Mean of a quantity that varies exponentially between two nodes. */
export function logMean(a: number, b: number): number {
  if (!(a > 0 && b > 0)) return (a + b) / 2;
  const r = a / b;
  if (Math.abs(r - 1) < 1e-4) return (a + b) / 2; // (a+b)/2 − logmean ≈ (a+b)/2 · (r−1)²/12 < 1e-9 relative
  return (a - b) / Math.log(r);
}

/**
 * @param column the validated column from the site up (levels.ts)
 * @param extension the nodes above the top (extension.ts)
 */
export function buildShellColumn(column: Column, extension: Extension, options: ShellOptions): ShellColumn {
  const resolution = options.resolution ?? 1;
  const { constants, compressibility, gravity, earthRadiusM } = options;
  const siteM = column.heightM[0]!;
  const z: number[] = [];
  const p: number[] = [];
  const t: number[] = [];
  const e: number[] = [];
  const wetExponential: boolean[] = []; // per shell
  const levels = column.heightM.length;
  for (let i = 0; i + 1 < levels; i++) {
    const z1 = column.heightM[i]!;
    const z2 = column.heightM[i + 1]!;
    const k = Math.max(1, Math.ceil((z2 - z1) / shellStepM(z1 - siteM, resolution)));
    const exponential = vapourExponential(column, i);
    for (let s = 0; s < k; s++) {
      const zs = z1 + ((z2 - z1) * s) / k;
      if (s === 0) {
        z.push(z1);
        p.push(column.pressureHpa[i]!);
        t.push(column.temperatureK[i]!);
        e.push(column.vapourPressureHpa[i]!);
      } else {
        const point = interpolateInLayer(column, i, zs);
        z.push(zs);
        p.push(point.pressureHpa);
        t.push(point.temperatureK);
        e.push(point.vapourPressureHpa);
      }
      wetExponential.push(exponential);
    }
  }
  const top = levels - 1;
  z.push(column.heightM[top]!);
  p.push(column.pressureHpa[top]!);
  t.push(column.temperatureK[top]!);
  e.push(column.vapourPressureHpa[top]!);
  const topNode = z.length - 1;
  for (let j = 0; j < extension.heightM.length; j++) {
    z.push(extension.heightM[j]!);
    p.push(extension.pressureHpa[j]!);
    t.push(extension.temperatureK);
    e.push(0);
  }

  const nodes = z.length;
  const shells = nodes - 1;
  const heightM = Float64Array.from(z);
  const radiusM = heightM.map((h) => earthRadiusM + h);
  const gravityM_S2 = heightM.map((h) => gravity.at(h));
  const nodeHydrostatic = new Float64Array(nodes);
  const nodeWet = new Float64Array(nodes);
  const nodeVapourDensity = new Float64Array(nodes);
  const nodeEOverT = new Float64Array(nodes);
  const nodeEOverT2 = new Float64Array(nodes);
  for (let j = 0; j < nodes; j++) {
    const pj = p[j]!;
    const tj = t[j]!;
    const ej = e[j]!;
    const zd = compressibility ? inverseCompressibilityDry(pj - ej, tj) : 1;
    const zw = compressibility ? inverseCompressibilityWet(ej, tj) : 1;
    nodeHydrostatic[j] = hydrostaticRefractivity(constants, pj, ej, tj, zd, zw);
    nodeWet[j] = wetRefractivity(constants, ej, tj, zw);
    nodeVapourDensity[j] = ((100 * ej) / (RV_J_PER_KG_K * tj)) * zw; // e in Pa
    nodeEOverT[j] = ej / tj;
    nodeEOverT2[j] = ej / (tj * tj);
  }

  const hydrostaticN = new Float64Array(shells);
  const wetN = new Float64Array(shells);
  const refractiveIndex = new Float64Array(shells);
  const vapourDensityKgM3 = new Float64Array(shells);
  const eOverT = new Float64Array(shells);
  const eOverT2 = new Float64Array(shells);
  for (let j = 0; j < shells; j++) {
    hydrostaticN[j] = logMean(nodeHydrostatic[j]!, nodeHydrostatic[j + 1]!);
    if (j < topNode) {
      const mean = wetExponential[j] ? logMean : arithmeticMean;
      wetN[j] = mean(nodeWet[j]!, nodeWet[j + 1]!);
      vapourDensityKgM3[j] = mean(nodeVapourDensity[j]!, nodeVapourDensity[j + 1]!);
      eOverT[j] = mean(nodeEOverT[j]!, nodeEOverT[j + 1]!);
      eOverT2[j] = mean(nodeEOverT2[j]!, nodeEOverT2[j + 1]!);
    } // above the top: dry (zeros)
    refractiveIndex[j] = 1 + PER_N_UNIT * (hydrostaticN[j]! + wetN[j]!);
  }

  return {
    heightM,
    radiusM,
    pressureHpa: Float64Array.from(p),
    temperatureK: Float64Array.from(t),
    vapourPressureHpa: Float64Array.from(e),
    gravityM_S2,
    hydrostaticN,
    wetN,
    refractiveIndex,
    vapourDensityKgM3,
    eOverT,
    eOverT2,
    shells,
    topNode,
  };
}

const arithmeticMean = (a: number, b: number) => (a + b) / 2;
