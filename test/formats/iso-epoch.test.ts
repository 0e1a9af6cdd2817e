/** The cached ISO 8601 formatter must write exactly what Date#toISOString writes (ECMA-262 Date Time String Format). */
import { describe, expect, it } from 'vitest';
import { isoEpoch } from '../../src/formats/iso-epoch.js';
import { mulberry32 } from '../../scripts/synthetic/network.js';

describe('isoEpoch equals Date#toISOString (ECMA-262 §21.4.1.32)', () => {
  it('on 20 000 random epochs from 1970 to 9999, leap days and day boundaries', () => {
    const random = mulberry32(5);
    const epochs = [
      0,
      Date.UTC(2024, 1, 29, 23, 59, 59, 999),
      Date.UTC(2024, 2, 1),
      Date.UTC(9999, 11, 31, 23, 59, 59, 999),
      -1,
      Date.UTC(1969, 6, 20, 20, 17),
    ];
    for (let i = 0; i < 20_000; i++) epochs.push(Math.floor(random() * 253_402_300_799_999));
    for (let i = 0; i < 2000; i++) epochs.push(Date.UTC(2026, 0, 1) + i * 300_000 + (i % 7)); // a regular series
    for (const ms of epochs) expect(isoEpoch(ms)).toBe(new Date(ms).toISOString());
  });
});
