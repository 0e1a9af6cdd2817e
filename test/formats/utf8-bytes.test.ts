/**
 * utf8Bytes (src/formats/json-columns.ts) against TextEncoder, the encoder it replaces for ASCII text
 * (WHATWG Encoding Standard, UTF-8 encode; a lone surrogate becomes U+FFFD): the same bytes for any text,
 * and bytes that own their buffer exactly (common practice: the worker pool moves such buffers).
 */

import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { utf8Bytes } from '../../src/formats/json-columns.js';

const encoder = new TextEncoder();
const same = (text: string) => Buffer.from(utf8Bytes(text)).equals(Buffer.from(encoder.encode(text)));

describe('utf8Bytes: the bytes of TextEncoder', () => {
  it('ASCII, Latin-1 (two UTF-8 bytes), BMP, astral, lone surrogates, empty, long', () => {
    for (const text of [
      '',
      'a',
      '{"zwd_m":0.1}',
      'é',
      '°',
      '≥ 30 s',
      '😀',
      '\ud800',
      'x\udc00y',
      '\u007f',
      'a'.repeat(100_000),
      `${'a'.repeat(50_000)}é`,
    ]) {
      expect(same(text), JSON.stringify(text.slice(0, 20))).toBe(true);
    }
  });

  it('any text (fast-check)', () => {
    fc.assert(
      fc.property(
        fc.oneof(fc.string(), fc.string({ unit: 'binary' }), fc.string({ unit: 'grapheme' }), fc.string({ unit: 'binary-ascii' })),
        (text) => {
          expect(same(text)).toBe(true);
        },
      ),
      { numRuns: 2000 },
    );
  });

  it('owns its buffer exactly, short (below the Buffer pool threshold) and long', () => {
    for (const text of ['{"ok":true}', 'é', 'b'.repeat(10_000)]) {
      const bytes = utf8Bytes(text);
      expect([bytes.byteOffset, bytes.byteLength]).toEqual([0, bytes.buffer.byteLength]);
    }
  });
});
