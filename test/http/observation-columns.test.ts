/**
 * The one-loop check and conversion of observations as column arrays (checkedObservationColumns,
 * src/http/adapters/zwd-estimation.ts, issue 14) against the full column check it stands in for
 * (readColumns of src/http/columns.ts, then observationsFromColumns): on valid columns the same domain
 * columns value for value; on every kind of invalid column no answer at all, so that the full check
 * runs and its error names the column and the row. The reference is the full check itself (an
 * independent path: a zod-derived checker per value, then a separate conversion pass).
 */

import { describe, expect, it } from 'vitest';
import { mulberry32 } from '../../scripts/synthetic-residuals.js';
import { columnSpecsOf, readColumns, type ColumnSpec } from '../../src/http/columns.js';
import { checkedObservationColumns, observationsFromColumns } from '../../src/http/adapters/zwd-estimation.js';
import { zwdObservationSchema } from '../../src/http/schemas/zwd-estimates.js';

const SPECS = columnSpecsOf(zwdObservationSchema.shape) as Record<keyof typeof zwdObservationSchema.shape, ColumnSpec>;
const MAX_ROWS = 1000;

/** 120 invented observations: 20 epochs × 6 satellites, one epoch text per run of rows (as a receiver writes them). */
function validColumns(withSigma: boolean) {
  const uniform = mulberry32(20261203);
  const n = 120;
  const epoch = Array.from({ length: n }, (_, i) => `2026-06-21T06:${String(Math.floor(i / 6)).padStart(2, '0')}:30Z`);
  const satellite = Array.from({ length: n }, (_, i) => `X${(i % 6) + 1}`);
  const columns: Record<string, unknown[]> = {
    epoch,
    satellite,
    elevation_deg: Array.from({ length: n }, () => 0.5 + 89.5 * uniform()),
    azimuth_deg: Array.from({ length: n }, () => 360 * uniform()),
    residual_m: Array.from({ length: n }, () => 0.05 * (uniform() - 0.5)),
  };
  if (withSigma) columns.sigma_m = Array.from({ length: n }, (_, i) => (i % 4 === 0 ? null : 0.002 + 0.01 * uniform()));
  return columns;
}

/** The full check and conversion (the path errors come from). */
function fullPath(columns: unknown) {
  const read = readColumns(columns, 'observations', SPECS, MAX_ROWS, 'observations');
  return read.ok ? observationsFromColumns(read.columns) : undefined;
}

describe('valid columns: the same domain columns as the full check and conversion', () => {
  for (const withSigma of [false, true]) {
    it(`${withSigma ? 'with sigma_m (null on some rows)' : 'without sigma_m'}`, () => {
      const columns = validColumns(withSigma);
      const fast = checkedObservationColumns(columns, SPECS, MAX_ROWS);
      expect(fast).toBeDefined();
      expect(fast).toEqual(fullPath(columns));
    });
  }
  it('sigma_m all null: no sigma column, as the full conversion', () => {
    const columns = { ...validColumns(false), sigma_m: new Array(120).fill(null) };
    const fast = checkedObservationColumns(columns, SPECS, MAX_ROWS);
    expect(fast?.sigmaM).toBeUndefined();
    expect(fast).toEqual(fullPath(columns));
  });
  it('number columns as Float64Array (an Arrow table read as typed columns)', () => {
    const columns = validColumns(false);
    const typed = { ...columns, elevation_deg: Float64Array.from(columns.elevation_deg as number[]) };
    expect(checkedObservationColumns(typed, SPECS, MAX_ROWS)).toEqual(fullPath(columns));
  });
});

describe('invalid columns: no answer, so that the full check names the column and the row', () => {
  const cases: [string, (c: Record<string, unknown>) => unknown][] = [
    ['an unknown column', (c) => ({ ...c, elevation: c.elevation_deg })],
    ['a missing column', ({ satellite: _s, ...c }) => c],
    ['a column that is not an array', (c) => ({ ...c, residual_m: 0.01 })],
    ['columns of unequal length', (c) => ({ ...c, azimuth_deg: (c.azimuth_deg as number[]).slice(1) })],
    [
      'more rows than the limit',
      (c) => Object.fromEntries(Object.entries(c).map(([k, v]) => [k, Array(MAX_ROWS + 1).fill((v as unknown[])[0])])),
    ],
    ['elevation above 90°', (c) => ({ ...c, elevation_deg: (c.elevation_deg as number[]).map((v, i) => (i === 77 ? 90.5 : v)) })],
    ['a number as text', (c) => ({ ...c, residual_m: (c.residual_m as unknown[]).map((v, i) => (i === 3 ? String(v) : v)) })],
    [
      'null in a required number column',
      (c) => ({ ...c, azimuth_deg: (c.azimuth_deg as unknown[]).map((v, i) => (i === 119 ? null : v)) }),
    ],
    ['sigma_m of 0', (c) => ({ ...c, sigma_m: (c.residual_m as unknown[]).map((_, i) => (i === 50 ? 0 : 0.003)) })],
    ['an epoch that is not ISO 8601', (c) => ({ ...c, epoch: (c.epoch as string[]).map((v, i) => (i === 60 ? '21/06/2026 06:10' : v)) })],
    [
      'an epoch missing in a run of equal epochs',
      (c) => ({ ...c, epoch: (c.epoch as unknown[]).map((v, i) => (i === 1 ? undefined : v)) }),
    ],
    ['an empty satellite name', (c) => ({ ...c, satellite: (c.satellite as string[]).map((v, i) => (i === 8 ? '' : v)) })],
    ['a satellite as a number', (c) => ({ ...c, satellite: (c.satellite as unknown[]).map((v, i) => (i === 9 ? 5 : v)) })],
    ['NaN in a typed column', (c) => ({ ...c, residual_m: Float64Array.from(c.residual_m as number[], (v, i) => (i === 10 ? NaN : v)) })],
    ['no rows', (c) => Object.fromEntries(Object.keys(c).map((k) => [k, []]))],
    ['an array of observations instead of columns', () => [{ epoch: '2026-06-21T06:00:30Z' }]],
  ];
  for (const [name, spoil] of cases) {
    it(name, () => {
      const columns = spoil(validColumns(true));
      expect(checkedObservationColumns(columns, SPECS, MAX_ROWS)).toBeUndefined();
      // The full check refuses it too, with the column (and row) named.
      const read = readColumns(columns, 'observations', SPECS, MAX_ROWS, 'observations');
      expect(read.ok).toBe(false);
      if (!read.ok) expect(read.errors[0]!.field).toMatch(/^observations/);
    });
  }
});
