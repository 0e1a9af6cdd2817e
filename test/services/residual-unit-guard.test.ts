/**
 * guardResidualUnit (src/services/unit-guards.ts): residuals sent in millimetres are refused with the median
 * absolute deviation from each epoch's median, whether the observations come in epoch order (grouped as they are)
 * or not (grouped by a sort). The deviation is checked against an independent computation here (groups by a Map,
 * medians by a full sort: the textbook definition), and the threshold of 1 m against residuals of known spread
 * (common practice: a tropospheric residual spreads by centimetres, one in millimetres by tens of "metres").
 */

import { describe, expect, it } from 'vitest';
import { mulberry32 } from '../../scripts/synthetic/network.js';
import { CallerError } from '../../src/services/caller-error.js';
import { guardResidualUnit } from '../../src/services/unit-guards.js';

const sortedMedian = (values: number[]) => {
  const v = [...values].sort((a, b) => a - b);
  const m = v.length >> 1;
  return v.length % 2 ? v[m]! : (v[m - 1]! + v[m]!) / 2;
};

/** The median absolute deviation from each epoch's median over epochs of two or more observations (textbook). */
function referenceMad(epochMs: number[], residualM: number[]): number {
  const groups = new Map<number, number[]>();
  epochMs.forEach((t, i) => groups.set(t, [...(groups.get(t) ?? []), residualM[i]!]));
  const deviations: number[] = [];
  for (const g of groups.values()) if (g.length >= 2) for (const r of g) deviations.push(Math.abs(r - sortedMedian(g)));
  return sortedMedian(deviations);
}

/** Observations of `epochs` epochs at 30 s, 5–9 satellites each, residuals of spread ~`spreadM` around a clock bias per epoch. */
function observations(seed: number, epochs: number, spreadM: number) {
  const random = mulberry32(seed);
  const epochMs: number[] = [];
  const residualM: number[] = [];
  for (let k = 0; k < epochs; k++) {
    const clockM = (random() - 0.5) * 100 * spreadM;
    const inView = 5 + Math.floor(random() * 5);
    for (let s = 0; s < inView; s++) {
      epochMs.push(Date.UTC(2026, 5, 21) + k * 30_000);
      residualM.push(clockM + (random() - 0.5) * 2 * spreadM);
    }
  }
  return { epochMs, residualM };
}

/** The same observations in another order (Fisher–Yates with a fixed seed). */
function shuffled(o: { epochMs: number[]; residualM: number[] }, seed: number) {
  const random = mulberry32(seed);
  const order = o.epochMs.map((_, i) => i);
  for (let i = order.length - 1; i > 0; i--) {
    const j = Math.floor(random() * (i + 1));
    [order[i], order[j]] = [order[j]!, order[i]!];
  }
  return { epochMs: order.map((i) => o.epochMs[i]!), residualM: order.map((i) => o.residualM[i]!) };
}

/** The deviation the guard reports (its message, 3 significant digits), or null when it lets the residuals pass. */
function refusedSpread(o: { epochMs: number[]; residualM: number[] }, typed: boolean): number | null {
  try {
    guardResidualUnit(typed ? Float64Array.from(o.epochMs) : o.epochMs, typed ? Float64Array.from(o.residualM) : o.residualM);
    return null;
  } catch (err) {
    expect(err).toBeInstanceOf(CallerError);
    expect((err as CallerError).status).toBe(400);
    const spread = /residual_m spreads by (\S+) m/.exec((err as Error).message);
    expect(spread).not.toBeNull();
    return Number(spread![1]);
  }
}

describe('guardResidualUnit: median absolute deviation from the epoch medians (textbook definition as reference)', () => {
  it('residuals in metres (spread 2 cm) pass, in epoch order and shuffled', () => {
    const metres = observations(3, 200, 0.02);
    expect(referenceMad(metres.epochMs, metres.residualM)).toBeLessThan(0.05);
    for (const typed of [false, true]) {
      expect(refusedSpread(metres, typed)).toBeNull();
      expect(refusedSpread(shuffled(metres, 7), typed)).toBeNull();
    }
  });

  it('the same residuals in millimetres are refused with the reference deviation (3 digits), in epoch order and shuffled', () => {
    const metres = observations(4, 200, 0.02);
    const millimetres = { epochMs: metres.epochMs, residualM: metres.residualM.map((r) => r * 1000) };
    const expected = Number(referenceMad(millimetres.epochMs, millimetres.residualM).toPrecision(3));
    expect(expected).toBeGreaterThan(1);
    for (const typed of [false, true]) {
      expect(refusedSpread(millimetres, typed)).toBe(expected);
      expect(refusedSpread(shuffled(millimetres, 11), typed)).toBe(expected);
    }
  });

  it('epochs out of order in one place only (the sort path) give the same deviation as in order', () => {
    const metres = observations(5, 120, 0.02);
    const mm = { epochMs: metres.epochMs, residualM: metres.residualM.map((r) => r * 1000) };
    const swapped = { epochMs: [...mm.epochMs], residualM: [...mm.residualM] };
    const last = swapped.epochMs.length - 1;
    [swapped.epochMs[0], swapped.epochMs[last]] = [swapped.epochMs[last]!, swapped.epochMs[0]!];
    [swapped.residualM[0], swapped.residualM[last]] = [swapped.residualM[last]!, swapped.residualM[0]!];
    expect(refusedSpread(swapped, true)).toBe(Number(referenceMad(mm.epochMs, mm.residualM).toPrecision(3)));
  });

  it('fewer than 10 deviations: nothing to judge, whatever the spread', () => {
    expect(refusedSpread({ epochMs: [0, 0, 0, 30_000, 30_000, 30_000], residualM: [0, 500, -500, 0, 700, -700] }, true)).toBeNull();
  });
});
