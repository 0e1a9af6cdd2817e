/**
 * Progress of a long command (an upload day by day, a campaign followed until done), told in one of three
 * ways: a bar redrawn in place (cli-progress; for a person at a terminal), one plain line per step (a log
 * file, CI), or nothing (scripts that read the JSON summary). The library functions take a Progress and
 * never write to a stream themselves.
 */

import { SingleBar } from 'cli-progress';

export interface Progress {
  /** A task of `total` steps begins; `label` names it ("deposit FERN", "campaign c-12"). */
  start(total: number, label: string): void;
  /** `done` steps of `total` are finished; `note` says the last one ("2026-03-14 sent"). */
  update(done: number, note: string, total?: number): void;
  /** The task ended (done, failed or cancelled); `summary` is its last word. */
  stop(summary: string): void;
}

/** Says nothing. */
export const SILENT: Progress = { start() {}, update() {}, stop() {} };

export type ProgressMode = 'bar' | 'lines' | 'none';

/** A writable stream as cli-progress and the line reporter use it. */
export interface ProgressStream extends NodeJS.WritableStream {
  isTTY?: boolean;
  columns?: number;
}

/**
 * `auto` → a bar on a terminal, lines otherwise. A bar on a stream that is not a terminal (forced with
 * mode `bar`) is drawn once per update, each on its own line.
 */
export function progressFor(mode: ProgressMode | 'auto', stream: ProgressStream): Progress {
  const chosen = mode === 'auto' ? (stream.isTTY ? 'bar' : 'lines') : mode;
  if (chosen === 'bar') return barProgress(stream);
  if (chosen === 'lines') return lineProgress(stream);
  return SILENT;
}

function barProgress(stream: ProgressStream): Progress {
  let bar: SingleBar | undefined;
  return {
    start(total, label) {
      bar = new SingleBar({
        stream,
        format: `${label} [{bar}] {percentage}% | {value}/{total} | {note}`,
        barCompleteChar: '#',
        barIncompleteChar: '-',
        hideCursor: stream.isTTY === true,
        // a forced bar on a pipe or file: one drawing per update instead of none
        noTTYOutput: !stream.isTTY,
        notTTYSchedule: 0,
        etaBuffer: 20,
      });
      bar.start(total, 0, { note: '' });
    },
    update(done, note, total) {
      if (total !== undefined) bar?.setTotal(total);
      bar?.update(done, { note });
    },
    stop(summary) {
      bar?.stop();
      bar = undefined;
      stream.write(`${summary}\n`);
    },
  };
}

function lineProgress(stream: ProgressStream): Progress {
  let totalSteps = 0;
  let lastLine = '';
  return {
    start(total, label) {
      totalSteps = total;
      stream.write(`${label}: ${total} step${total === 1 ? '' : 's'}\n`);
    },
    update(done, note, total) {
      if (total !== undefined) totalSteps = total;
      const line = `${done}/${totalSteps} ${note}`;
      // a campaign polled every few seconds repeats itself while nothing moves: say it once
      if (line !== lastLine) stream.write(`${line}\n`);
      lastLine = line;
    },
    stop(summary) {
      stream.write(`${summary}\n`);
    },
  };
}
