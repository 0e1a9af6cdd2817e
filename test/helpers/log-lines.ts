/**
 * A pino destination for tests: a writable stream that keeps every JSON log line written to it, parsed, so a
 * test can find the lines an app logged (request logs, the workers' warm-up lines).
 */

import { Writable } from 'node:stream';

export type LogLine = Record<string, unknown>;

/** A stream to pass as pino's destination, and the lines written to it so far. */
export function collector(): { stream: Writable; lines: LogLine[] } {
  const lines: LogLine[] = [];
  const stream = new Writable({
    write(chunk: Buffer, _encoding, done) {
      for (const l of chunk.toString('utf8').split('\n')) if (l.trim()) lines.push(JSON.parse(l) as LogLine);
      done();
    },
  });
  return { stream, lines };
}
