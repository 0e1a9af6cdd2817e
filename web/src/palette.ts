/**
 * Colour of a PWV value: viridis (perceptually uniform, readable with the common colour-vision
 * deficiencies and in grey scale), from d3-scale-chromatic.
 */
import { interpolateViridis } from 'd3-scale-chromatic';

export interface ColourScale {
  minMm: number;
  maxMm: number;
}

export const FIXED_SCALE: ColourScale = { minMm: 0, maxMm: 60 };

/** Scale fitted to the values, rounded outward to 5 mm (at least 5 mm wide). */
export function fittedScale(values: number[]): ColourScale {
  if (values.length === 0) return FIXED_SCALE;
  const lo = Math.floor(Math.min(...values) / 5) * 5;
  const hi = Math.max(lo + 5, Math.ceil(Math.max(...values) / 5) * 5);
  return { minMm: lo, maxMm: hi };
}

export function colourOf(pwvMm: number, scale: ColourScale): string {
  const t = (pwvMm - scale.minMm) / (scale.maxMm - scale.minMm);
  return interpolateViridis(Math.min(1, Math.max(0, t)));
}
