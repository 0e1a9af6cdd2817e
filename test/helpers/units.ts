/** Units for tolerances in tests: write `0.1 * MM`, not `1e-4`. */
export const M = 1;
export const MM = 1e-3;
export const CM = 1e-2;
export const KM = 1000;
export const HPA = 1;
export const DEG = Math.PI / 180;
