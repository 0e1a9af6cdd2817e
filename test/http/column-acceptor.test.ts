/**
 * acceptorOf (src/http/columns.ts): whether a column value is valid, as the one-pass JSON reader and the
 * Arrow/JSON column checks ask it once per distinct text. For an ISO date-time schema (epochSchema) it
 * tests the schema's pattern directly instead of calling safeParse; the reference is the schema's own
 * answer, `safeParse(value).success` (zod, an independent path through its checks), on hand-picked
 * texts at the pattern's edges and on random texts (fast-check). A schema with more than its pattern
 * (a chained refinement, another format) must still be asked itself.
 */

import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import { acceptorOf, columnSpecsOf } from '../../src/http/columns.js';
import { epochSchema } from '../../src/http/schemas/common.js';
import { zwdObservationSchema } from '../../src/http/schemas/zwd-estimates.js';

/** Texts at the edges of an ISO 8601 date-time (common practice: RFC 3339 §5.6 and its usual mistakes). */
const EDGE_TEXTS = [
  '2026-06-21T06:30:00Z',
  '2026-06-21T06:30:00.123Z',
  '2026-06-21T06:30:00.123456789Z',
  '2026-06-21T06:30:00+02:00',
  '2026-06-21T06:30:00-11:30',
  '2024-02-29T00:00:00Z', // leap day
  '2023-02-29T00:00:00Z', // not a leap year
  '2000-02-29T00:00:00Z', // divisible by 400
  '1900-02-29T00:00:00Z', // divisible by 100 only
  '2026-04-31T00:00:00Z',
  '2026-13-01T00:00:00Z',
  '2026-06-21T24:00:00Z',
  '2026-06-21T23:60:00Z',
  '2026-06-21T23:59:60Z',
  '2026-06-21t06:30:00z',
  '2026-06-21 06:30:00Z',
  '2026-06-21T06:30Z',
  '2026-06-21T06:30:00',
  '2026-06-21T06:30:00Z\n',
  ' 2026-06-21T06:30:00Z',
  '2026-06-21T06:30:00.Z',
  '2026-06-21T06:30:00+0200',
  '+002026-06-21T06:30:00Z',
  '',
];
const NOT_TEXTS = [undefined, null, 0, 1.5, true, {}, [], ['2026-06-21T06:30:00Z']];

describe('an ISO date-time schema: its pattern tested directly, the same answer as safeParse', () => {
  const accepts = acceptorOf(epochSchema);

  it('on texts at the edges of the format, and on values that are not texts', () => {
    for (const v of [...EDGE_TEXTS, ...NOT_TEXTS]) expect(accepts(v), JSON.stringify(v)).toBe(epochSchema.safeParse(v).success);
  });

  it('on random date-time-like texts and any text (fast-check)', () => {
    const digits = (n: number) => fc.array(fc.constantFrom(...'0123456789'), { minLength: n, maxLength: n }).map((d) => d.join(''));
    const dateTimeLike = fc
      .tuple(digits(4), digits(2), digits(2), digits(2), digits(2), digits(2), fc.constantFrom('', '.5', '.123', '.1234567'))
      .chain(([y, mo, d, h, mi, s, f]) =>
        fc.constantFrom('Z', '+01:00', '-23:59', '+24:00', 'z', '').map((zone) => `${y}-${mo}-${d}T${h}:${mi}:${s}${f}${zone}`),
      );
    fc.assert(
      fc.property(fc.oneof(dateTimeLike, fc.string(), fc.string({ unit: 'binary' })), (text) => {
        expect(accepts(text)).toBe(epochSchema.safeParse(text).success);
      }),
      { numRuns: 3000 },
    );
  });

  it('the epoch column of the observation schema takes it', () => {
    const spec = columnSpecsOf(zwdObservationSchema.shape).epoch!;
    for (const v of EDGE_TEXTS) expect(spec.accepts(v), v).toBe(epochSchema.safeParse(v).success);
  });
});

describe('a schema with more than its pattern is asked itself', () => {
  it('a date-time schema with a refinement chained to it', () => {
    const only2026 = z.iso.datetime({ offset: true }).refine((t) => t.startsWith('2026'), { error: 'must be in 2026' });
    const accepts = acceptorOf(only2026);
    expect(accepts('2026-06-21T06:30:00Z')).toBe(true);
    expect(accepts('2025-06-21T06:30:00Z')).toBe(false); // the pattern alone would take it
  });

  it('a date-time schema with a length check chained to it', () => {
    const short = z.iso.datetime({ offset: true }).max(20);
    const accepts = acceptorOf(short);
    expect(accepts('2026-06-21T06:30:00Z')).toBe(true);
    expect(accepts('2026-06-21T06:30:00.123Z')).toBe(false); // the pattern alone would take it
  });

  it('other string schemas (satellite names)', () => {
    const spec = columnSpecsOf(zwdObservationSchema.shape).satellite!;
    for (const v of ['G01', '', 'x'.repeat(32), 'x'.repeat(33), 7, null])
      expect(spec.accepts(v), String(v)).toBe(spec.schema.safeParse(v).success);
  });
});
