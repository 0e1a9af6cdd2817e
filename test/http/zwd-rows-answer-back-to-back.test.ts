/**
 * The rows answer of POST /v1/zwd-estimates is written through one scratch buffer per thread (stringifiedBytes,
 * src/formats/json-columns.ts): two different requests back to back on one thread (the GPS-like day of `npm run
 * bench -- columns` and a 3-hour slice of it, test/helpers/gps-like-days.ts, seed 11) must each get their own
 * answer, the shorter after the longer with no tail of it, and an answer already handed over must not change
 * when the next one is written (common practice for a reused buffer). The reference of each answer's bytes is
 * JSON.stringify's own text of it (parsed and stringified again: JSON.stringify's text is canonical).
 */

import { describe, expect, it } from 'vitest';
import { handleZwdRequest } from '../../src/http/tasks/zwd-request.js';
import { columnsJson, dayRequest } from '../helpers/gps-like-days.js';

async function rowsAnswer(body: Uint8Array): Promise<Uint8Array> {
  const outcome = await handleZwdRequest({ body: new Uint8Array(body), format: 'json', query: {}, queryKeys: [] });
  if (!outcome.ok) throw new Error(`estimation failed: ${JSON.stringify(outcome)}`);
  return outcome.output.json;
}

const canonical = (bytes: Uint8Array) =>
  Buffer.from(new TextEncoder().encode(JSON.stringify(JSON.parse(Buffer.from(bytes).toString('utf8')) as unknown)));

describe('rows answers back to back on one thread', () => {
  it('a day, then a 3-hour slice, then the day: each its own bytes, none changed by the next', async () => {
    const day = columnsJson(dayRequest());
    const slice = columnsJson(dayRequest({ durationS: 3 * 3600, grossErrors: 3 }));
    const first = await rowsAnswer(day);
    const firstCopy = Buffer.from(first);
    const second = await rowsAnswer(slice);
    const secondCopy = Buffer.from(second);
    const third = await rowsAnswer(day);

    expect(second.byteLength).toBeLessThan(first.byteLength / 4);
    expect(Buffer.from(first).equals(firstCopy), 'the first answer unchanged by the next two').toBe(true);
    expect(Buffer.from(second).equals(secondCopy), 'the second answer unchanged by the third').toBe(true);
    expect(Buffer.from(third).equals(firstCopy), 'the same request, the same bytes').toBe(true);
    expect(firstCopy.equals(canonical(first))).toBe(true);
    expect(secondCopy.equals(canonical(second)), 'the shorter answer after the longer: no tail of it').toBe(true);
    for (const bytes of [first, second, third]) expect([bytes.byteOffset, bytes.byteLength]).toEqual([0, bytes.buffer.byteLength]);
  });
});
