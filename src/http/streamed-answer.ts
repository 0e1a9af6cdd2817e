/**
 * Answers of the station-year reads (stored met, stored delays, station PWV), built piece by piece
 * so that the event loop only moves bytes: the rows come from the repository in keyset pages
 * (Repository.readPages), each page is shaped and serialised on its own, and the loop is yielded
 * (setImmediate) between pages, so a health check or another request runs between two slices of a
 * read instead of after the whole read. One slice is one page: READ_PAGE_ROWS rows read, shaped and
 * serialised (a few milliseconds; `npm run bench -- health-open-batches` measures health meanwhile).
 *
 * An answer up to WHOLE_ANSWER_MAX_CHARS is sent whole (with Content-Length, as before); a larger
 * one is streamed (chunked transfer), piece after piece, with backpressure: a client that does not
 * read holds at most a page and the socket's buffers, never the whole answer. The pieces are the
 * bytes one JSON.stringify / one join would give, so the answer is the same byte for byte
 * (test/http/station-reads-paged.test.ts).
 *
 * Errors: one before the first byte (a 404, a database fault on the first pages) is a problem answer
 * as usual. A database fault after streaming began can no longer change the status: the connection
 * is closed without the final chunk, so the client sees an incomplete answer, never a short one that
 * looks complete (docs/operations.md).
 */

import { Readable } from 'node:stream';
import { setImmediate as nextTurn } from 'node:timers/promises';
import type { FastifyReply } from 'fastify';
import type { PageReadOptions, Repository, SeriesPageKind, SeriesPageRows, TimeRange } from '../storage/repository.js';

/**
 * Rows per page of a station-year read. 1 000 rows: reading, shaping and serialising one page of met
 * as JSON takes about 2–4 ms on the quiet 2-core machine (a page of PWV records about twice that); with
 * 2 000 rows `GET /v1/health` p99 was 101–134 ms under four clients (two 100 000-item batches, two
 * station-year readers), with 1 000 rows 63–79 ms (`npm run bench -- health-open-batches`, issue 11:
 * < 100 ms). A station-year (105 120 five-minute rows) is about 105 pages; the per-page overhead (one
 * statement, one turn of the loop) stays small.
 */
export const READ_PAGE_ROWS = 1000;

/** Largest answer sent whole [characters]; above it the answer is streamed. */
export const WHOLE_ANSWER_MAX_CHARS = 1024 * 1024;

/** A paged read that gives the event loop a turn after every page (before the next statement runs). */
export async function* loopFriendlyPages<K extends SeriesPageKind>(
  repository: Repository,
  kind: K,
  stationId: string,
  range: TimeRange,
  options: Partial<PageReadOptions> = {},
): AsyncGenerator<SeriesPageRows[K][], void, undefined> {
  for await (const page of repository.readPages(kind, stationId, range, { pageRows: READ_PAGE_ROWS, ...options })) {
    yield page;
    await nextTurn();
  }
}

/** Slices of [0, n) of at most READ_PAGE_ROWS, with a turn of the event loop between them. */
export async function* loopFriendlySlices(n: number): AsyncGenerator<[start: number, end: number], void, undefined> {
  for (let start = 0; start < n; start += READ_PAGE_ROWS) {
    if (start > 0) await nextTurn();
    yield [start, Math.min(n, start + READ_PAGE_ROWS)];
  }
}

/**
 * Sends the concatenation of `pieces` with the given content type and headers: whole when it ends
 * within WHOLE_ANSWER_MAX_CHARS, else as a stream (the pieces read so far first).
 */
export async function sendPieces(
  reply: FastifyReply,
  contentType: string,
  pieces: AsyncIterable<string>,
  headers: Record<string, string> = {},
): Promise<FastifyReply> {
  const iterator = pieces[Symbol.asyncIterator]();
  const head: string[] = [];
  let chars = 0;
  while (chars <= WHOLE_ANSWER_MAX_CHARS) {
    const next = await iterator.next();
    if (next.done) return reply.headers(headers).type(contentType).send(head.join(''));
    head.push(next.value);
    chars += next.value.length;
  }
  async function* rest(): AsyncGenerator<string, void, undefined> {
    try {
      yield head.join('');
      for (;;) {
        const next = await iterator.next();
        if (next.done) return;
        if (next.value.length > 0) yield next.value;
      }
    } finally {
      // A client that went away: end the read (the page generator's own finally runs).
      await iterator.return?.();
    }
  }
  return reply
    .headers(headers)
    .type(contentType)
    .send(Readable.from(rest(), { objectMode: false }));
}
