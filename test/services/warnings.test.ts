/** Warnings as data (src/services/warnings.ts): collapsed by code, never by matching their wording (common practice). */
import { describe, expect, it } from 'vitest';
import { collapseByCode, warning } from '../../src/services/warnings.js';

describe('collapseByCode', () => {
  it('keeps one warning per code in order of first appearance, with the count when repeated', () => {
    const ws = [
      warning('negative-wet-delay', 'series.zwd_m: wet delay is negative'),
      warning('tm-extrapolated', 'series.temperature_c: Tm is extrapolated'),
      warning('negative-wet-delay', 'series.zwd_m: wet delay is negative'),
      warning('negative-wet-delay', 'a different wording of the same condition'),
    ];
    expect(collapseByCode(ws)).toEqual([
      { code: 'negative-wet-delay', text: 'series.zwd_m: wet delay is negative (3 epochs)' },
      { code: 'tm-extrapolated', text: 'series.temperature_c: Tm is extrapolated' },
    ]);
  });
  it('does not merge equal texts of different codes', () => {
    expect(collapseByCode([warning('a', 'same'), warning('b', 'same')])).toHaveLength(2);
  });
});
