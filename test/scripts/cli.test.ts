import { describe, expect, it } from 'vitest';
import { epochOption, helpText, numberOption, parseCli, UsageError, type CliSpec } from '../../scripts/cli.js';
import { SYNTHETIC_CLI, syntheticCliOutput } from '../../scripts/synthetic-residuals.js';

// The generators' command line (scripts/cli.ts): --help instead of a data dump, strict options, checked
// numbers and epochs (ISO 8601 with a zone, as the API takes them).
const SPEC: CliSpec = {
  command: 'npx tsx scripts/example.ts',
  summary: 'An example.',
  options: {
    start: { type: 'string', value: 'EPOCH', description: 'first epoch', default: '2026-03-14T00:00:00Z' },
    hours: { type: 'string', value: 'HOURS', description: 'length', default: '6' },
    csv: { type: 'boolean', description: 'CSV' },
  },
};

describe('scripts/cli.ts', () => {
  it('--help (and -h) is recognised and the help lists every option with its default', () => {
    expect(parseCli(SPEC, ['--help']).help).toBe(true);
    expect(parseCli(SPEC, ['-h']).help).toBe(true);
    const help = helpText(SPEC);
    expect(help).toContain('Usage: npx tsx scripts/example.ts [options]');
    expect(help).toMatch(/--start EPOCH +first epoch \(default 2026-03-14T00:00:00Z\)/);
    expect(help).toMatch(/--csv +CSV\n/);
    expect(help).toMatch(/--help +print this help and exit/);
  });

  it('absent options keep their defaults; booleans default to false', () => {
    expect(parseCli(SPEC, []).values).toEqual({ start: '2026-03-14T00:00:00Z', hours: '6', csv: false });
    expect(parseCli(SPEC, ['--hours', '0.5', '--csv']).values).toEqual({ start: '2026-03-14T00:00:00Z', hours: '0.5', csv: true });
  });

  it('an unknown option, a missing value or a positional argument is a usage error', () => {
    expect(() => parseCli(SPEC, ['--hourz', '2'])).toThrow(UsageError);
    expect(() => parseCli(SPEC, ['--hours'])).toThrow(UsageError);
    expect(() => parseCli(SPEC, ['residuals.csv'])).toThrow(UsageError);
  });

  it('numbers are checked against their range; epochs must be ISO 8601 with a zone', () => {
    expect(numberOption({ hours: '0.5' }, 'hours', 0.01, 240)).toBe(0.5);
    expect(() => numberOption({ hours: '0' }, 'hours', 0.01, 240)).toThrow(/--hours must be a number in \[0.01, 240\], got "0"/);
    expect(() => numberOption({ hours: 'six' }, 'hours', 0.01, 240)).toThrow(UsageError);
    expect(epochOption({ start: '2026-07-10T00:30:00Z' }, 'start')).toBe(Date.UTC(2026, 6, 10, 0, 30));
    expect(epochOption({ start: '2026-07-10T02:30:00+02:00' }, 'start')).toBe(Date.UTC(2026, 6, 10, 0, 30));
    expect(() => epochOption({ start: '2026-07-10' }, 'start')).toThrow(/ISO 8601 date-time with a zone/);
    expect(() => epochOption({ start: '2026-07-10T00:00:00' }, 'start')).toThrow(UsageError);
  });
});

describe('scripts/synthetic-residuals.ts command line', () => {
  const run = (argv: string[]) => syntheticCliOutput(parseCli(SYNTHETIC_CLI, argv).values);

  it('--start moves the first epoch; --hours and --sampling set the span (0.5 h at 30 s: epochs 00:30:00 .. 01:00:00)', () => {
    const csv = run(['--csv', '--start', '2026-07-10T00:30:00Z', '--hours', '0.5']).trim().split('\n');
    expect(csv[0]).toBe('epoch,satellite,elevation_deg,azimuth_deg,residual_m');
    const epochs = [...new Set(csv.slice(1).map((line) => line.split(',')[0]))];
    expect(epochs[0]).toBe('2026-07-10T00:30:00.000Z');
    expect(epochs.at(-1)).toBe('2026-07-10T01:00:00.000Z');
    expect(epochs).toHaveLength(61);
  });

  it('--station leaves out the site; --apriori-zhd and --zwd-interval go into the body', () => {
    const body = JSON.parse(run(['--station', '--hours', '0.1', '--apriori-zhd', '2.2546', '--zwd-interval', '900']));
    expect(Object.keys(body)).toEqual(['observations', 'apriori', 'options']);
    expect(body.apriori).toEqual({ zhd_m: 2.2546 });
    expect(body.options).toEqual({ zwd_interval_s: 900 });
    expect(Object.keys(JSON.parse(run(['--hours', '0.1'])))).toEqual(['site', 'observations']);
  });

  it('the same options give the same bytes (seeded); another seed gives other residuals', () => {
    expect(run(['--csv', '--hours', '0.1'])).toBe(run(['--csv', '--hours', '0.1']));
    expect(run(['--csv', '--hours', '0.1', '--seed', '2'])).not.toBe(run(['--csv', '--hours', '0.1']));
  });

  it('--station with --csv is refused (the CSV route takes the site and options in its query)', () => {
    expect(() => run(['--csv', '--station'])).toThrow(UsageError);
  });
});
