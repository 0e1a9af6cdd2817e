/**
 * The text of a series answer (JSON or CSV) as pieces, one per page of rows, so that a station-year
 * is serialised a page at a time (src/http/streamed-answer.ts sends them). The concatenated pieces
 * are exactly the bytes of JSON.stringify of the whole answer object, or of the whole CSV table.
 */

export const JSON_TYPE = 'application/json; charset=utf-8';
export const CSV_TYPE = 'text/csv; charset=utf-8';

/**
 * `{...head, "records": [...], ...tail()}` as JSON.stringify writes it: the head's keys, the records
 * page by page, then the tail's keys (computed after the last page, so it may summarise the records).
 */
export async function* jsonRecordPieces<R>(
  head: Record<string, unknown>,
  pages: AsyncIterable<readonly R[]>,
  record: (row: R) => unknown,
  tail: () => Record<string, unknown> | Promise<Record<string, unknown>> = () => ({}),
): AsyncGenerator<string, void, undefined> {
  const headText = JSON.stringify(head);
  yield `${headText.slice(0, -1)}${headText.length > 2 ? ',' : ''}"records":[`;
  let first = true;
  for await (const page of pages) {
    if (page.length === 0) continue;
    const parts = new Array<string>(page.length);
    for (let i = 0; i < page.length; i++) parts[i] = JSON.stringify(record(page[i]!));
    yield first ? parts.join(',') : `,${parts.join(',')}`;
    first = false;
  }
  const tailText = JSON.stringify(await tail());
  yield tailText.length > 2 ? `],${tailText.slice(1)}` : ']}';
}

/** A CSV table: the header row of `columns`, then the lines of each page; every line ends with a newline. */
export async function* csvPieces<R>(
  columns: readonly string[],
  pages: AsyncIterable<readonly R[]>,
  lines: (rows: readonly R[]) => string[],
): AsyncGenerator<string, void, undefined> {
  yield `${columns.join(',')}\n`;
  for await (const page of pages) {
    if (page.length > 0) yield `${lines(page).join('\n')}\n`;
  }
}
