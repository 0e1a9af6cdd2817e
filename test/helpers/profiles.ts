import type { GeneratedLevel } from '../../scripts/generators/us-standard-atmosphere-1976.js';
import type { ProfileLevelInput } from '../../src/domain/profile/levels.js';

/** Generator levels as domain input, humidity as the generator's vapour pressure (its truth). */
export function toDomainLevels(levels: readonly GeneratedLevel[], heights: 'height' | 'geopotential' = 'height'): ProfileLevelInput[] {
  return levels.map((l) => ({
    ...(heights === 'height' ? { heightM: l.heightM } : { geopotentialHeightM: l.geopotentialHeightM }),
    pressureHpa: l.pressureHpa,
    temperatureC: l.temperatureK - 273.15,
    vapourPressureHpa: l.vapourPressureHpa,
  }));
}

/** Composite Simpson rule of f on [a, b] with n (even) intervals. */
export function simpson(f: (x: number) => number, a: number, b: number, n = 20_000): number {
  const h = (b - a) / n;
  let sum = f(a) + f(b);
  for (let k = 1; k < n; k++) sum += (k % 2 ? 4 : 2) * f(a + k * h);
  return (sum * h) / 3;
}
