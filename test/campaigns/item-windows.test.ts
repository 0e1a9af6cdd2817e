/**
 * The geometry of campaign items (src/services/campaigns/item-windows.ts) against its definition in
 * docs/campaigns.md ("Station-windows"): kept parts of step S tile the span [start 00:00 UTC, end + 1 day)
 * with no gap and no overlap (every epoch stored by exactly one item); each window has L − S split
 * equally before and after its kept part; a station-day is the item of L = S = 24 h keyed by its day.
 * Expected values are worked by hand from that definition (common practice: calendar arithmetic in UTC).
 */

import { describe, expect, it } from 'vitest';
import { daysOverlapping, itemSpans, keyAtEpoch, spanOfKey, windowFromHours } from '../../src/services/campaigns/item-windows.js';

const H = 3_600_000;
const at = (iso: string) => Date.parse(iso);

describe('station-days (no window)', () => {
  it('one item per UTC day, keyed by the day, window = kept part = the day', () => {
    const spans = itemSpans('2026-02-27', '2026-03-01', null);
    expect(spans.map((s) => s.key)).toEqual(['2026-02-27', '2026-02-28', '2026-03-01']);
    expect(spans[1]).toEqual({
      key: '2026-02-28',
      keepFromMs: at('2026-02-28T00:00:00Z'),
      keepToMs: at('2026-03-01T00:00:00Z'),
      fromMs: at('2026-02-28T00:00:00Z'),
      toMs: at('2026-03-01T00:00:00Z'),
    });
    expect(keyAtEpoch(at('2026-02-28T23:59:59.999Z'), '2026-02-27', '2026-03-01', null)).toBe('2026-02-28');
    expect(keyAtEpoch(at('2026-03-02T00:00:00Z'), '2026-02-27', '2026-03-01', null)).toBeNull();
  });
});

describe('windows of 48 h every 24 h (a 2-day sliding solution keeping the central day)', () => {
  const w = windowFromHours(48, 24);
  it('keeps each day and reads 12 h on either side', () => {
    const s = spanOfKey('2026-05-02T00:00:00Z', '2026-05-01', '2026-05-03', w);
    expect(s).toEqual({
      key: '2026-05-02T00:00:00Z',
      keepFromMs: at('2026-05-02T00:00:00Z'),
      keepToMs: at('2026-05-03T00:00:00Z'),
      fromMs: at('2026-05-01T12:00:00Z'),
      toMs: at('2026-05-03T12:00:00Z'),
    });
    expect(daysOverlapping(s.fromMs, s.toMs)).toEqual(['2026-05-01', '2026-05-02', '2026-05-03']);
  });
});

describe('windows shorter than a day and a step that does not divide the span', () => {
  it('6 h windows every 5 h over one day: 5 items, the last kept part cut at the end of the span', () => {
    const spans = itemSpans('2026-05-01', '2026-05-01', windowFromHours(6, 5));
    expect(spans.map((s) => (s.keepToMs - s.keepFromMs) / H)).toEqual([5, 5, 5, 5, 4]);
    // Margin (6 − 5) / 2 = 0.5 h on each side.
    expect(spans.map((s) => (s.keepFromMs - s.fromMs) / H)).toEqual([0.5, 0.5, 0.5, 0.5, 0.5]);
    expect(spans.map((s) => (s.toMs - s.fromMs) / H)).toEqual([6, 6, 6, 6, 6]);
  });
});

describe('the kept parts tile the span: every epoch belongs to exactly one item', () => {
  for (const [length, step] of [
    [24, 24],
    [36, 12],
    [7, 3],
    [240, 24],
    [1, 1],
  ] as const) {
    it(`length ${length} h, step ${step} h over 2026-03-28 … 2026-04-02`, () => {
      const spans = itemSpans('2026-03-28', '2026-04-02', windowFromHours(length, step));
      expect(spans[0]!.keepFromMs).toBe(at('2026-03-28T00:00:00Z'));
      expect(spans.at(-1)!.keepToMs).toBe(at('2026-04-03T00:00:00Z'));
      for (let k = 1; k < spans.length; k++) expect(spans[k]!.keepFromMs).toBe(spans[k - 1]!.keepToMs);
      // Each epoch (every 7.5 min) maps back to the item that keeps it, and the key round-trips.
      for (let t = at('2026-03-28T00:00:00Z'); t < at('2026-04-03T00:00:00Z'); t += 450_000) {
        const key = keyAtEpoch(t, '2026-03-28', '2026-04-02', windowFromHours(length, step))!;
        const s = spanOfKey(key, '2026-03-28', '2026-04-02', windowFromHours(length, step));
        expect(t >= s.keepFromMs && t < s.keepToMs).toBe(true);
        expect(s.fromMs <= s.keepFromMs && s.toMs >= s.keepToMs).toBe(true);
      }
    });
  }
});
