/**
 * The declaration of the `tropo-client` command line: every command with its options, from which the
 * parser (node:util parseArgs, strict), the help texts and the checks derive. Usage errors are
 * UsageError (exit code 2).
 */

import { parseArgs } from 'node:util';

export class UsageError extends Error {
  override name = 'UsageError';
}

export interface OptionSpec {
  type: 'string' | 'boolean';
  /** Placeholder of the value in the help, e.g. `ID`. */
  value?: string;
  description: string;
  required?: boolean;
  /** May be given several times (strings only). */
  multiple?: boolean;
  /** Allowed values (strings), checked by the parser. */
  choices?: readonly string[];
  default?: string;
}

export interface CommandSpec {
  /** e.g. `met-upload` or `campaign submit`. */
  name: string;
  summary: string;
  /** Positional arguments after the command name, e.g. `CAMPAIGN_ID`. */
  positionals?: string[];
  options: Record<string, OptionSpec>;
  examples: string[];
}

/** Options every command takes. */
export const COMMON_OPTIONS: Record<string, OptionSpec> = {
  url: { type: 'string', value: 'URL', description: 'service base URL (default env TROPODELAY_CLIENT_URL, else http://127.0.0.1:8080)' },
  key: { type: 'string', value: 'KEY', description: 'API key secret, sent as Authorization: Bearer (default env TROPODELAY_CLIENT_KEY)' },
  progress: {
    type: 'string',
    value: 'MODE',
    choices: ['auto', 'bar', 'lines', 'none'],
    description: 'progress on stderr: a bar on a terminal, plain lines otherwise (auto), or as named',
    default: 'auto',
  },
  quiet: { type: 'boolean', description: 'no progress and no summary; errors only' },
  json: { type: 'boolean', description: 'print the result as one JSON document on stdout, no progress' },
  help: { type: 'boolean', description: 'print this help and exit' },
};

const STATION: OptionSpec = { type: 'string', value: 'ID', description: 'station id in the archive', required: true };
const STATE: OptionSpec = { type: 'string', value: 'FILE', description: 'resume state file (default <file>.tropo-state.json)' };
const CAMPAIGN_ID = ['CAMPAIGN_ID'];
const INTERVAL: OptionSpec = { type: 'string', value: 'SECONDS', description: 'time between two status polls', default: '2' };

export const COMMANDS: CommandSpec[] = [
  {
    name: 'met-upload',
    summary:
      'Upload met records from a CSV, RINEX met or JSON file to a station, one UTC day per request; a rerun sends only the days not yet accepted (resume state next to the file).',
    options: {
      station: STATION,
      file: {
        type: 'string',
        value: 'FILE',
        description: 'CSV (epoch column), RINEX meteorological file, or JSON {records}',
        required: true,
      },
      source: { type: 'string', value: 'NAME', description: 'producer name of rows without their own source' },
      state: STATE,
      force: { type: 'boolean', description: 'send every day, even those already accepted' },
    },
    examples: ['tropo-client met-upload --station FERN --file fern-met.csv --source mast --key "$KEY"'],
  },
  {
    name: 'residuals-deposit',
    summary:
      'Deposit observation residuals from a CSV of many days as station-days (PUT per UTC day); a rerun skips the days the service still holds as sent.',
    options: {
      station: STATION,
      file: {
        type: 'string',
        value: 'FILE',
        description: 'observation CSV: epoch, satellite, elevation_deg, azimuth_deg, residual_m[, sigma_m]',
        required: true,
      },
      state: STATE,
      force: { type: 'boolean', description: 'send every day, even those already deposited' },
    },
    examples: ['tropo-client residuals-deposit --station FERN --file fern-march.csv --key "$KEY"'],
  },
  {
    name: 'estimate',
    summary:
      'Run a ZWD estimation on a request file (JSON, CSV or Arrow by its extension) and write the answer; with --station the estimation of that station, stored as its delay series.',
    options: {
      file: {
        type: 'string',
        value: 'FILE',
        description: 'request body: .json, .csv (site and options as --param) or .arrow',
        required: true,
      },
      station: { type: 'string', value: 'ID', description: 'estimate for this archive station (needs a write key)' },
      param: { type: 'string', value: 'NAME=VALUE', multiple: true, description: 'query parameter, e.g. latitude_deg=46.2 (repeatable)' },
      out: { type: 'string', value: 'FILE', description: 'write the answer here (default stdout)' },
    },
    examples: [
      'tropo-client estimate --file residuals.csv --param latitude_deg=46.2 --param longitude_deg=7.4 --param height_m=520 --out answer.json',
    ],
  },
  {
    name: 'series',
    summary: "Download a station's stored delays, PWV or met of a range to a file: JSON or CSV, PWV also netCDF.",
    options: {
      station: STATION,
      kind: { type: 'string', value: 'KIND', choices: ['delays', 'pwv', 'met'], description: 'which series', required: true },
      format: { type: 'string', value: 'FORMAT', choices: ['json', 'csv', 'netcdf'], description: 'file format', default: 'json' },
      from: { type: 'string', value: 'TIME', description: 'first epoch (ISO 8601, inclusive; a date is the whole day)' },
      to: { type: 'string', value: 'TIME', description: 'last epoch (inclusive)' },
      source: { type: 'string', value: 'NAME', description: 'only this source of the series' },
      out: { type: 'string', value: 'FILE', description: 'file to write', required: true },
    },
    examples: ['tropo-client series --station FERN --kind pwv --format csv --from 2026-07-10 --to 2026-07-11 --out fern-pwv.csv'],
  },
  {
    name: 'campaign submit',
    summary:
      'Submit a reprocessing campaign over the residuals of a span of days (deposited, or uploaded afterwards with campaign upload), as station-days or station-windows; --follow then shows its progress until done.',
    options: {
      'start-date': { type: 'string', value: 'YYYY-MM-DD', description: 'first day (UTC)', required: true },
      'end-date': { type: 'string', value: 'YYYY-MM-DD', description: 'last day, inclusive', required: true },
      stations: {
        type: 'string',
        value: 'A,B,...',
        description: 'station ids (default: every station with deposits in the span; required with --residuals uploaded)',
      },
      name: { type: 'string', value: 'TEXT', description: 'a name for the campaign' },
      options: { type: 'string', value: 'JSON|@FILE', description: 'estimation options as JSON text or @file.json', default: '{}' },
      residuals: {
        type: 'string',
        value: 'FROM',
        choices: ['deposited', 'uploaded'],
        description: 'deposited in the archive, or uploaded to the campaign after submission (campaign upload)',
        default: 'deposited',
      },
      'window-hours': {
        type: 'string',
        value: 'HOURS',
        description: 'station-windows of this many hours instead of station-days (the service states its range)',
      },
      'step-hours': {
        type: 'string',
        value: 'HOURS',
        description: 'step between windows = the centre part of each window that is stored (1..window-hours; default window-hours)',
      },
      follow: { type: 'boolean', description: 'follow the campaign until finished or cancelled' },
      'interval-s': INTERVAL,
    },
    examples: [
      'tropo-client campaign submit --start-date 2026-03-01 --end-date 2026-03-31 --options \'{"zwd_interval_s":900}\' --follow',
      'tropo-client campaign submit --start-date 2026-03-01 --end-date 2026-03-31 --stations FERN,GLEN --residuals uploaded --window-hours 48 --step-hours 24',
    ],
  },
  {
    name: 'campaign upload',
    summary:
      "Upload a station's residuals from a CSV of many days to a campaign of uploaded residuals, one UTC day per request; a rerun skips the days the campaign still holds as sent.",
    positionals: CAMPAIGN_ID,
    options: {
      station: STATION,
      file: {
        type: 'string',
        value: 'FILE',
        description: 'observation CSV: epoch, satellite, elevation_deg, azimuth_deg, residual_m[, sigma_m]',
        required: true,
      },
      state: STATE,
      force: { type: 'boolean', description: 'send every day, even those already uploaded' },
    },
    examples: ['tropo-client campaign upload 3f2a… --station FERN --file fern-march.csv'],
  },
  {
    name: 'campaign close-uploads',
    summary:
      'Tell a campaign of uploaded residuals that nothing more will come: items with some input run, the others end without residuals.',
    positionals: CAMPAIGN_ID,
    options: {},
    examples: ['tropo-client campaign close-uploads 3f2a…'],
  },
  {
    name: 'campaign follow',
    summary: 'Show the progress of a campaign until it is finished or cancelled (exit 1 when items failed or it was cancelled).',
    positionals: CAMPAIGN_ID,
    options: { 'interval-s': INTERVAL },
    examples: ['tropo-client campaign follow 3f2a…'],
  },
  {
    name: 'campaign cancel',
    summary: 'Cancel a campaign: pending items are not started.',
    positionals: CAMPAIGN_ID,
    options: {},
    examples: ['tropo-client campaign cancel 3f2a…'],
  },
  {
    name: 'campaign report',
    summary: "Fetch a campaign's report: homogeneity, fingerprints, exceptions, throughput.",
    positionals: CAMPAIGN_ID,
    options: { out: { type: 'string', value: 'FILE', description: 'write the report here (default stdout)' } },
    examples: ['tropo-client campaign report 3f2a… --out report.json'],
  },
  {
    name: 'campaign list',
    summary: 'List the campaigns with their states and counts.',
    options: {},
    examples: ['tropo-client campaign list'],
  },
];

/** The help of all commands (no command or `--help` alone). */
export function overviewHelp(): string {
  const rows = COMMANDS.map((c) => `  ${c.name.padEnd(20)} ${c.summary.split(/[.;:]\s|\s\(/)[0]!.replace(/\.$/, '')}`);
  return (
    `Usage: tropo-client <command> [options]\n\nA client of the tropodelay service for processing scripts and operators.\n\n` +
    `Commands:\n${rows.join('\n')}\n\nEvery command takes:\n${optionRows(COMMON_OPTIONS)}\n\n` +
    `"tropo-client <command> --help" describes a command. Exit codes: 0 done, 1 failed (service, file or ` +
    `rejected records), 2 usage error.\n`
  );
}

export function commandHelp(spec: CommandSpec): string {
  const usage = `tropo-client ${spec.name}${spec.positionals?.length ? ` ${spec.positionals.join(' ')}` : ''} [options]`;
  return (
    `Usage: ${usage}\n\n${spec.summary}\n\nOptions:\n${optionRows(spec.options)}\n${optionRows(COMMON_OPTIONS)}\n\n` +
    `Examples:\n${spec.examples.map((e) => `  ${e}`).join('\n')}\n`
  );
}

function optionRows(options: Record<string, OptionSpec>): string {
  return Object.entries(options)
    .map(([name, o]) => {
      const flag = `--${name}${o.type === 'string' ? ` ${o.value ?? 'VALUE'}` : ''}`;
      const extra = [
        o.required ? 'required' : '',
        o.choices ? `one of ${o.choices.join(', ')}` : '',
        o.default !== undefined ? `default ${o.default}` : '',
      ].filter(Boolean);
      return `  ${flag.padEnd(26)} ${o.description}${extra.length ? ` (${extra.join('; ')})` : ''}`;
    })
    .join('\n');
}

export type OptionValues = Record<string, string | boolean | string[] | undefined>;

export interface ParsedCommand {
  spec: CommandSpec | undefined;
  help: boolean;
  values: OptionValues;
  positionals: string[];
}

/**
 * Finds the command (one or two words) and parses its options strictly.
 * @throws UsageError for an unknown command or option, a missing value, a missing required option, a value
 *   not among its choices, or a wrong number of positionals
 */
export function parseCommandLine(argv: string[]): ParsedCommand {
  if (argv.length === 0 || argv[0] === '--help' || argv[0] === '-h') return { spec: undefined, help: true, values: {}, positionals: [] };
  const spec = COMMANDS.find((c) => c.name === argv.slice(0, c.name.split(' ').length).join(' '));
  if (!spec) {
    const words = argv[0] === 'campaign' ? `campaign ${argv[1] ?? ''}`.trim() : argv[0];
    throw new UsageError(`unknown command ${JSON.stringify(words)}: one of ${COMMANDS.map((c) => c.name).join(', ')}`);
  }
  const all = { ...spec.options, ...COMMON_OPTIONS };
  let parsed;
  try {
    parsed = parseArgs({
      args: argv.slice(spec.name.split(' ').length),
      strict: true,
      allowPositionals: true,
      options: Object.fromEntries(
        Object.entries(all).map(([name, o]) => [
          name,
          { type: o.type, multiple: o.multiple ?? false, ...(name === 'help' ? { short: 'h' } : {}) },
        ]),
      ),
    });
  } catch (err) {
    throw new UsageError((err as Error).message);
  }
  if (parsed.values.help === true) return { spec, help: true, values: {}, positionals: [] };
  const values: OptionValues = {};
  for (const [name, o] of Object.entries(all)) {
    const value = parsed.values[name] ?? o.default;
    if (o.required && value === undefined) throw new UsageError(`${spec.name}: --${name} is required (${o.description})`);
    if (o.choices && typeof value === 'string' && !o.choices.includes(value))
      throw new UsageError(`--${name} must be one of ${o.choices.join(', ')}, got ${JSON.stringify(value)}`);
    values[name] = value as OptionValues[string];
  }
  const expected = spec.positionals ?? [];
  if (parsed.positionals.length !== expected.length)
    throw new UsageError(
      expected.length
        ? `${spec.name} takes ${expected.join(' ')}, got ${parsed.positionals.length ? parsed.positionals.join(' ') : 'nothing'}`
        : `${spec.name} takes no arguments besides options, got ${parsed.positionals.join(' ')}`,
    );
  return { spec, help: false, values, positionals: parsed.positionals };
}
