#!/usr/bin/env node
/**
 * `tropo-client`: the command line over the library (index.ts). Each command calls one library function;
 * this file only turns options into its arguments and its result into output: progress on stderr (a bar,
 * lines or nothing), a one-line summary or, with --json, the result as JSON on stdout.
 * Exit codes: 0 done; 1 the service refused, a file could not be read, records were rejected, or a
 * followed campaign ended with failed items or cancelled; 2 usage error.
 */

import { readFileSync, realpathSync, writeFileSync } from 'node:fs';
import { pathToFileURL } from 'node:url';
import {
  campaignReport,
  cancelCampaign,
  closeCampaignUploads,
  describe,
  followCampaign,
  listCampaigns,
  submitCampaign,
  type CampaignStatus,
} from './campaigns.js';
import { commandHelp, overviewHelp, parseCommandLine, UsageError, type OptionValues } from './cli-spec.js';
import { InputFileError } from './day-split.js';
import { runEstimation } from './estimation.js';
import { uploadMet } from './met-upload.js';
import { progressFor, SILENT, type Progress, type ProgressMode, type ProgressStream } from './progress.js';
import { depositResiduals } from './residual-deposit.js';
import { downloadSeries, type SeriesFormat, type SeriesKind } from './series-download.js';
import { Service, ServiceError, type QueryValue } from './service.js';

export interface CliIo {
  stdout: ProgressStream;
  stderr: ProgressStream;
  env: Record<string, string | undefined>;
}

const DEFAULT_URL = 'http://127.0.0.1:8080';

/** What a command hands back: the JSON result, its one-line summary, and whether it counts as failed (exit 1). */
interface Outcome {
  result: unknown;
  summary: string;
  failed?: boolean;
}

interface Context {
  service: Service;
  values: OptionValues;
  positionals: string[];
  progress: Progress;
  io: CliIo;
}

/** Runs one command line; resolves with the exit code. */
export async function main(
  argv: string[],
  io: CliIo = { stdout: process.stdout, stderr: process.stderr, env: process.env },
): Promise<number> {
  let parsed;
  try {
    parsed = parseCommandLine(argv);
  } catch (err) {
    if (!(err instanceof UsageError)) throw err;
    io.stderr.write(`tropo-client: ${err.message}\n(see tropo-client --help)\n`);
    return 2;
  }
  if (parsed.help) {
    io.stdout.write(parsed.spec ? commandHelp(parsed.spec) : overviewHelp());
    return 0;
  }
  const { values, positionals } = parsed;
  const quiet = values.quiet === true || values.json === true;
  try {
    const service = serviceOf(values, io.env);
    const progress = quiet ? SILENT : progressFor(values.progress as ProgressMode | 'auto', io.stderr);
    const outcome = await RUNNERS[parsed.spec!.name]!({ service, values, positionals, progress, io });
    if (values.json === true && outcome.result !== undefined) io.stdout.write(JSON.stringify(outcome.result) + '\n');
    else if (values.quiet !== true && outcome.summary) io.stdout.write(outcome.summary + '\n');
    return outcome.failed ? 1 : 0;
  } catch (err) {
    if (err instanceof UsageError) {
      io.stderr.write(`tropo-client: ${err.message}\n(see tropo-client ${parsed.spec!.name} --help)\n`);
      return 2;
    }
    if (err instanceof ServiceError || err instanceof InputFileError || isFileError(err)) {
      io.stderr.write(`tropo-client: ${(err as Error).message}\n`);
      return 1;
    }
    const unreachable = unreachableMessage(err);
    if (unreachable) {
      io.stderr.write(`tropo-client: ${unreachable}\n`);
      return 1;
    }
    throw err;
  }
}

const RUNNERS: Record<string, (ctx: Context) => Promise<Outcome>> = {
  'met-upload': async ({ service, values, progress, io }) => {
    const result = await uploadMet(service, {
      stationId: stringOption(values, 'station')!,
      file: stringOption(values, 'file')!,
      source: stringOption(values, 'source'),
      statePath: stringOption(values, 'state'),
      force: values.force === true,
      progress,
    });
    if (values.quiet !== true && values.json !== true)
      for (const r of result.rejected.slice(0, 20))
        io.stderr.write(`rejected ${r.line !== undefined ? `line ${r.line}` : `record ${r.index}`}: ${r.reason}\n`);
    return {
      result,
      summary: `${result.daysSent} day(s) sent, ${result.daysSkipped} skipped; ${result.inserted} inserted, ${result.updated} updated, ${result.unchanged} unchanged, ${result.rejected.length} rejected`,
      failed: result.rejected.length > 0,
    };
  },
  'residuals-deposit': async ({ service, values, progress }) => {
    const result = await depositResiduals(service, {
      stationId: stringOption(values, 'station')!,
      file: stringOption(values, 'file')!,
      statePath: stringOption(values, 'state'),
      force: values.force === true,
      progress,
    });
    return {
      result,
      summary: `${result.daysSent} day(s) deposited (${result.observationsSent} observations), ${result.daysSkipped} already held`,
    };
  },
  estimate: async ({ service, values, io }) => {
    const answer = await runEstimation(service, {
      file: stringOption(values, 'file')!,
      stationId: stringOption(values, 'station'),
      query: queryParams(values.param),
    });
    const out = stringOption(values, 'out');
    if (out === undefined || out === '-') {
      // the answer is the output: written whole, no summary line after it
      io.stdout.write(JSON.stringify(answer) + '\n');
      return { result: undefined, summary: '' };
    }
    writeFileSync(out, JSON.stringify(answer) + '\n');
    const stats = (answer as { statistics?: { observations_used?: number; epochs?: number } }).statistics;
    return {
      result: { out, statistics: stats },
      summary: `wrote ${out} (${stats?.epochs ?? '?'} epochs, ${stats?.observations_used ?? '?'} observations used)`,
    };
  },
  series: async ({ service, values }) => {
    const result = await downloadSeries(service, {
      stationId: stringOption(values, 'station')!,
      kind: values.kind as SeriesKind,
      format: values.format as SeriesFormat,
      from: stringOption(values, 'from'),
      to: stringOption(values, 'to'),
      source: stringOption(values, 'source'),
      out: stringOption(values, 'out')!,
    }).catch((err: unknown) => {
      throw err instanceof RangeError ? new UsageError(err.message) : err;
    });
    const homogeneity =
      result.homogeneous === undefined
        ? ''
        : result.homogeneous
          ? ', homogeneous'
          : `, NOT homogeneous (${result.modelFingerprints?.join(', ')})`;
    return { result, summary: `wrote ${result.out} (${result.bytes} bytes${homogeneity})` };
  },
  'campaign submit': async ({ service, values, progress }) => {
    const submitted = await submitCampaign(service, {
      start_date: dateOption(values, 'start-date'),
      end_date: dateOption(values, 'end-date'),
      ...(stringOption(values, 'name') !== undefined ? { name: stringOption(values, 'name') } : {}),
      ...(stringOption(values, 'stations') !== undefined ? { stations: stringOption(values, 'stations')!.split(',').filter(Boolean) } : {}),
      options: jsonOption(values, 'options'),
      residuals: values.residuals as 'deposited' | 'uploaded',
      ...windowOption(values),
    });
    if (values.follow !== true)
      return {
        result: submitted,
        summary: `campaign ${submitted.campaign_id}: ${submitted.state}, ${submitted.items_total} items (models ${submitted.model_fingerprint})`,
      };
    const status = await followCampaign(service, submitted.campaign_id, { intervalMs: intervalMs(values), progress });
    return followed(status);
  },
  'campaign upload': async ({ service, values, positionals, progress }) => {
    const result = await depositResiduals(service, {
      campaignId: positionals[0]!,
      stationId: stringOption(values, 'station')!,
      file: stringOption(values, 'file')!,
      statePath: stringOption(values, 'state'),
      force: values.force === true,
      progress,
    });
    const outside = result.daysOutsideSpan ? `, ${result.daysOutsideSpan} outside the span (not sent)` : '';
    return {
      result,
      summary: `${result.daysSent} day(s) uploaded (${result.observationsSent} observations), ${result.daysSkipped} already held${outside}; ${result.itemsReady} item(s) ready`,
    };
  },
  'campaign close-uploads': async ({ service, positionals }) => {
    const status = await closeCampaignUploads(service, positionals[0]!);
    return { result: status, summary: `campaign ${status.campaign_id}: ${describe(status)}` };
  },
  'campaign follow': async ({ service, values, positionals, progress }) =>
    followed(await followCampaign(service, positionals[0]!, { intervalMs: intervalMs(values), progress })),
  'campaign cancel': async ({ service, positionals }) => {
    const status = await cancelCampaign(service, positionals[0]!);
    return { result: status, summary: `campaign ${status.campaign_id}: ${describe(status)}` };
  },
  'campaign report': async ({ service, values, positionals, io }) => {
    const report = await campaignReport(service, positionals[0]!);
    const out = stringOption(values, 'out');
    if (out !== undefined) writeFileSync(out, JSON.stringify(report, null, 2) + '\n');
    else if (values.json !== true) io.stdout.write(JSON.stringify(report, null, 2) + '\n');
    const exceptions = report.exceptions.length ? `, ${report.exceptions.length} exception(s)` : '';
    return {
      result: report,
      summary: `campaign ${report.campaign_id}: ${report.state}, ${report.homogeneous ? 'homogeneous' : 'NOT homogeneous'}${exceptions}; ${report.items.done}/${report.items.total} done, ${report.items.failed} failed${out ? `; wrote ${out}` : ''}`,
    };
  },
  'campaign list': async ({ service }) => {
    const campaigns = await listCampaigns(service);
    const lines = campaigns.map((c) => `${c.campaign_id}  ${c.name ?? ''}  ${describe(c)}`);
    return { result: { campaigns }, summary: lines.length ? lines.join('\n') : 'no campaigns' };
  },
};

function followed(status: CampaignStatus): Outcome {
  return {
    result: status,
    summary: `campaign ${status.campaign_id}: ${describe(status)}`,
    failed: status.state === 'cancelled' || status.items_failed > 0,
  };
}

function serviceOf(values: OptionValues, env: CliIo['env']): Service {
  try {
    return new Service({
      baseUrl: stringOption(values, 'url') ?? env.TROPODELAY_CLIENT_URL ?? DEFAULT_URL,
      key: stringOption(values, 'key') ?? env.TROPODELAY_CLIENT_KEY,
    });
  } catch (err) {
    throw new UsageError(`--url: ${(err as Error).message}`);
  }
}

/** fetch's "fetch failed" with the socket error that caused it, or undefined for any other error. */
function unreachableMessage(err: unknown): string | undefined {
  if (!(err instanceof TypeError) || err.message !== 'fetch failed') return undefined;
  const cause = (err as { cause?: { code?: string; message?: string } }).cause;
  return `the service cannot be reached (${cause?.code ?? cause?.message ?? 'network error'}); check --url`;
}

function stringOption(values: OptionValues, name: string): string | undefined {
  const v = values[name];
  return typeof v === 'string' ? v : undefined;
}

function dateOption(values: OptionValues, name: string): string {
  const text = stringOption(values, name) ?? '';
  if (!/^\d{4}-\d\d-\d\d$/.test(text) || Number.isNaN(Date.parse(`${text}T00:00:00Z`)))
    throw new UsageError(`--${name} must be a date YYYY-MM-DD, got ${JSON.stringify(text)}`);
  return text;
}

/** `--window-hours L [--step-hours S]` → the request's window (whole hours; S defaults to L). */
function windowOption(values: OptionValues): { window?: { length_hours: number; step_hours: number } } {
  const length = stringOption(values, 'window-hours');
  const step = stringOption(values, 'step-hours');
  if (length === undefined) {
    if (step !== undefined) throw new UsageError('--step-hours needs --window-hours');
    return {};
  }
  // A whole number here; the range (and step ≤ length) is the service's to check: it answers 400 naming window.*.
  const hours = (name: string, text: string) => {
    const n = Number(text);
    if (!Number.isInteger(n) || n < 1) throw new UsageError(`--${name} must be a whole number of hours, got ${JSON.stringify(text)}`);
    return n;
  };
  const lengthHours = hours('window-hours', length);
  return { window: { length_hours: lengthHours, step_hours: step === undefined ? lengthHours : hours('step-hours', step) } };
}

function intervalMs(values: OptionValues): number {
  const seconds = Number(stringOption(values, 'interval-s'));
  if (!Number.isFinite(seconds) || seconds < 0.05 || seconds > 3600)
    throw new UsageError(`--interval-s must be a number of seconds in [0.05, 3600], got ${JSON.stringify(values['interval-s'])}`);
  return seconds * 1000;
}

/** `--options '{"zwd_interval_s":900}'` or `--options @options.json`: a JSON object. */
function jsonOption(values: OptionValues, name: string): Record<string, unknown> {
  const text = stringOption(values, name) ?? '{}';
  let parsed: unknown;
  try {
    parsed = JSON.parse(text.startsWith('@') ? readFileSync(text.slice(1), 'utf8') : text);
  } catch (err) {
    throw new UsageError(`--${name} must be a JSON object or @file.json: ${(err as Error).message}`);
  }
  if (typeof parsed !== 'object' || parsed === null || Array.isArray(parsed))
    throw new UsageError(`--${name} must be a JSON object such as {"zwd_interval_s":900}`);
  return parsed as Record<string, unknown>;
}

/** `--param name=value` (repeatable) as query parameters. */
function queryParams(param: OptionValues[string]): Record<string, QueryValue> {
  const list = Array.isArray(param) ? param : typeof param === 'string' ? [param] : [];
  const query: Record<string, QueryValue> = {};
  for (const item of list) {
    const eq = item.indexOf('=');
    if (eq <= 0) throw new UsageError(`--param must be NAME=VALUE, got ${JSON.stringify(item)}`);
    query[item.slice(0, eq)] = item.slice(eq + 1);
  }
  return query;
}

function isFileError(err: unknown): boolean {
  const code = (err as { code?: unknown } | null)?.code;
  return typeof code === 'string' && ['ENOENT', 'EACCES', 'EISDIR', 'ENOTDIR'].includes(code);
}

// run as a program (also through the npm bin link, hence the real path), not when imported
if (process.argv[1] !== undefined && import.meta.url === pathToFileURL(realpathSync(process.argv[1])).href) {
  process.exitCode = await main(process.argv.slice(2));
}
