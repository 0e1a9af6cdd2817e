/**
 * The command line of the generators under scripts/: one declaration of the options gives the parser
 * (node:util parseArgs, strict: an unknown option or a missing value is an error), the `--help` text
 * and the checks of numbers and epochs. Exit codes: 0 after `--help`, 2 for a usage error.
 */

import { mkdirSync, writeFileSync } from 'node:fs';
import { dirname, resolve } from 'node:path';
import { parseArgs } from 'node:util';

export interface CliOption {
  type: 'string' | 'boolean';
  /** Placeholder of the value in the help text, e.g. `HOURS`. */
  value?: string;
  description: string;
  /** Default as the help shows it (strings; booleans default to false). */
  default?: string;
}

export interface CliSpec {
  /** `npx tsx scripts/<name>.ts` line of the help. */
  command: string;
  /** One or two sentences: what the script writes and where. */
  summary: string;
  options: Record<string, CliOption>;
  /** Example command lines for the help. */
  examples?: string[];
}

export class UsageError extends Error {}

export const HELP_OPTION: CliOption = { type: 'boolean', description: 'print this help and exit' };

/** The help text of a spec (what `--help` prints). */
export function helpText(spec: CliSpec): string {
  const rows = Object.entries({ ...spec.options, help: HELP_OPTION }).map(([name, o]) => {
    const flag = `--${name}${o.type === 'string' ? ` ${o.value ?? 'VALUE'}` : ''}`;
    return `  ${flag.padEnd(24)} ${o.description}${o.default !== undefined ? ` (default ${o.default})` : ''}`;
  });
  const examples = spec.examples?.length ? `\nExamples:\n${spec.examples.map((e) => `  ${e}`).join('\n')}\n` : '';
  return `Usage: ${spec.command} [options]\n\n${spec.summary}\n\nOptions:\n${rows.join('\n')}\n${examples}`;
}

/**
 * Parses `argv` against `spec`; strings keep their defaults when absent. Throws UsageError for an
 * unknown option, a missing value or a positional argument.
 */
export function parseCli(spec: CliSpec, argv: string[]): { help: boolean; values: Record<string, string | boolean | undefined> } {
  let parsed;
  try {
    parsed = parseArgs({
      args: argv,
      strict: true,
      allowPositionals: false,
      options: Object.fromEntries(
        Object.entries({ ...spec.options, help: HELP_OPTION }).map(([name, o]) => [
          name,
          { type: o.type, ...(name === 'help' ? { short: 'h' } : {}) },
        ]),
      ),
    });
  } catch (err) {
    throw new UsageError(err instanceof Error ? err.message : String(err));
  }
  const values: Record<string, string | boolean | undefined> = {};
  for (const [name, o] of Object.entries(spec.options)) {
    const v = parsed.values[name];
    values[name] = v ?? (o.type === 'string' ? o.default : false);
  }
  return { help: parsed.values.help === true, values };
}

/** A finite number in [min, max] from option `name`. */
export function numberOption(values: Record<string, string | boolean | undefined>, name: string, min: number, max: number): number {
  const text = values[name];
  const n = typeof text === 'string' && text.trim() !== '' ? Number(text) : Number.NaN;
  if (!Number.isFinite(n) || n < min || n > max)
    throw new UsageError(`--${name} must be a number in [${min}, ${max}], got ${JSON.stringify(text)}`);
  return n;
}

/** An ISO 8601 date-time with a zone (Z or ±hh:mm) from option `name`, as epoch milliseconds. */
export function epochOption(values: Record<string, string | boolean | undefined>, name: string): number {
  const text = values[name];
  const ms =
    typeof text === 'string' && /^\d{4}-\d\d-\d\dT\d\d:\d\d(:\d\d(\.\d+)?)?(Z|[+-]\d\d:\d\d)$/.test(text) ? Date.parse(text) : Number.NaN;
  if (!Number.isFinite(ms))
    throw new UsageError(`--${name} must be an ISO 8601 date-time with a zone, e.g. 2026-07-10T00:00:00Z, got ${JSON.stringify(text)}`);
  return ms;
}

/**
 * Runs a generator's command line: prints the help for `--help`, reports a usage error with exit
 * code 2, else calls `main` with the parsed values.
 */
export function runCli(
  spec: CliSpec,
  main: (values: Record<string, string | boolean | undefined>) => void,
  argv = process.argv.slice(2),
): void {
  try {
    const { help, values } = parseCli(spec, argv);
    if (help) {
      process.stdout.write(helpText(spec));
      return;
    }
    main(values);
  } catch (err) {
    if (!(err instanceof UsageError)) throw err;
    process.stderr.write(`${spec.command.split(' ').pop()}: ${err.message}\n(see --help)\n`);
    process.exitCode = 2;
  }
}

/** Writes `text` to the file `out` (creating its folder; one line on stderr says so) or, without `out`, to stdout. */
export function writeOutput(text: string, out: string | boolean | undefined): void {
  if (typeof out !== 'string' || out === '' || out === '-') {
    process.stdout.write(text);
    return;
  }
  const path = resolve(out);
  mkdirSync(dirname(path), { recursive: true });
  writeFileSync(path, text);
  process.stderr.write(`wrote ${out} (${Buffer.byteLength(text)} bytes)\n`);
}
