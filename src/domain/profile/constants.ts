/**
 * Constants of the profile computations, each with its unit and authority. Values recalled rather
 * than checked against the publication say "from memory" (see docs/constants.md).
 */

import { RD_J_PER_KG_K, RV_J_PER_KG_K } from '../constants.js';

/**
 * WGS84 normal gravity on the ellipsoid at the equator [m/s²].
 * NIMA TR8350.2 (2000), Table 3.4 (from memory).
 */
export const WGS84_GAMMA_EQUATOR_M_S2 = 9.7803253359;

/**
 * Somigliana's constant k = (b γp)/(a γe) − 1 of WGS84 [-].
 * NIMA TR8350.2 (2000), eq. 4-1 and Table 3.4 (from memory); γp = 9.8321849379 m/s².
 */
export const WGS84_SOMIGLIANA_K = 0.00193185265241;

/**
 * m = ω² a² b / GM of WGS84 [-], which enters the height term of normal gravity.
 * NIMA TR8350.2 (2000), Table 3.4 (from memory).
 */
export const WGS84_M = 0.00344978650684;

/**
 * Ratio of the gas constants of dry air and water vapour, ε = Rd/Rv = Mw/Md [-], from the values of
 * src/domain/constants.ts (287.0464/461.5 = 0.62199; Mw/Md = 18.01528/28.9644 = 0.62198).
 */
export const EPSILON = RD_J_PER_KG_K / RV_J_PER_KG_K;

/** Refractivity unit: n = 1 + 1e-6 N [-]. */
export const PER_N_UNIT = 1e-6;
