/**
 * text/csv requests of the ZWD estimation: the observation table is the body (header row
 * epoch,satellite,elevation_deg,azimuth_deg,residual_m[,sigma_m], in any column order), site and
 * options are query parameters. The table and query become the same object a JSON request sends,
 * so the same schema validates both and errors name the same fields (observations.N is data row
 * N, 0-based, i.e. line N + 2 of the file).
 */

import { CsvError, parse } from 'csv-parse/sync';
import { detailOf, issuesToFieldErrors } from './field-errors.js';
import { HttpProblem } from './problem.js';
import { zwdCsvQuerySchema, type ZwdCsvQuery } from './schemas/zwd-estimates.js';

export const CSV_REQUIRED_COLUMNS = ['epoch', 'satellite', 'elevation_deg', 'azimuth_deg', 'residual_m'] as const;
export const CSV_OPTIONAL_COLUMNS = ['sigma_m'] as const;
const KNOWN_COLUMNS: readonly string[] = [...CSV_REQUIRED_COLUMNS, ...CSV_OPTIONAL_COLUMNS];
const NUMERIC_COLUMNS = new Set(['elevation_deg', 'azimuth_deg', 'residual_m', 'sigma_m']);
const NUMERAL = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;

/** CSV text → observation objects (numbers where the cell is a numeral; anything else is left for the schema to reject). */
export function parseObservationCsv(text: string): Record<string, unknown>[] {
  let records: string[][];
  try {
    records = parse(text, { skip_empty_lines: true, trim: true, comment: '#', bom: true }) as string[][];
  } catch (err) {
    if (err instanceof CsvError) {
      throw new HttpProblem(400, `body: not a valid CSV table (${err.message})`, [{ field: 'body', message: err.message }]);
    }
    throw err;
  }
  const header = records[0];
  if (!header) {
    throw new HttpProblem(400, `body: the CSV table is empty; it needs a header row (${CSV_REQUIRED_COLUMNS.join(',')}[,sigma_m]) and at least one observation`, [
      { field: 'body', message: 'empty CSV table' },
    ]);
  }
  const unknown = header.filter((c) => !KNOWN_COLUMNS.includes(c));
  const missing = CSV_REQUIRED_COLUMNS.filter((c) => !header.includes(c));
  const repeated = header.filter((c, i) => header.indexOf(c) !== i);
  if (unknown.length || missing.length || repeated.length) {
    const parts = [
      missing.length ? `missing column(s) ${missing.join(', ')}` : '',
      unknown.length ? `unknown column(s) ${unknown.join(', ')}` : '',
      repeated.length ? `repeated column(s) ${repeated.join(', ')}` : '',
    ].filter(Boolean);
    const message = `${parts.join('; ')}: the header row must name ${CSV_REQUIRED_COLUMNS.join(', ')} and optionally sigma_m`;
    throw new HttpProblem(400, `body: ${message}`, [{ field: 'body', message }]);
  }
  const out = new Array<Record<string, unknown>>(records.length - 1);
  for (let r = 1; r < records.length; r++) {
    const row = records[r]!;
    const obs: Record<string, unknown> = {};
    for (let c = 0; c < header.length; c++) {
      const name = header[c]!;
      const cell = row[c] ?? '';
      if (name === 'sigma_m' && cell === '') continue;
      obs[name] = NUMERIC_COLUMNS.has(name) && NUMERAL.test(cell) ? Number(cell) : cell;
    }
    out[r - 1] = obs;
  }
  return out;
}

/**
 * Builds the JSON-equivalent request from a CSV table and the query parameters. With
 * `siteKnown` (a station's estimation) the site parameters are not needed and not put in.
 */
export function csvRequestBody(text: string, rawQuery: unknown, siteKnown = false): Record<string, unknown> {
  const parsed = zwdCsvQuerySchema.safeParse(rawQuery ?? {});
  if (!parsed.success) {
    const errors = issuesToFieldErrors(parsed.error.issues, 'query');
    throw new HttpProblem(400, detailOf(errors), errors);
  }
  const q: ZwdCsvQuery = parsed.data;
  const missingSite = siteKnown ? [] : (['latitude_deg', 'longitude_deg', 'height_m'] as const).filter((k) => q[k] === undefined);
  if (missingSite.length) {
    const errors = missingSite.map((k) => ({ field: `query.${k}`, message: 'required with a text/csv body (the site)' }));
    throw new HttpProblem(400, `${errors[0]!.field}: ${errors[0]!.message}`, errors);
  }
  const apriori = Object.fromEntries(
    Object.entries({ zhd_m: q.apriori_zhd_m, zwd_m: q.apriori_zwd_m }).filter(([, v]) => v !== undefined),
  );
  return {
    ...(siteKnown ? {} : { site: { latitude_deg: q.latitude_deg, longitude_deg: q.longitude_deg, height_m: q.height_m } }),
    observations: parseObservationCsv(text),
    ...(Object.keys(apriori).length ? { apriori } : {}),
    options: {
      zwd_interval_s: q.zwd_interval_s,
      zwd_random_walk_m_per_sqrt_h: q.zwd_random_walk_m_per_sqrt_h,
      zwd_apriori_sigma_m: q.zwd_apriori_sigma_m,
      gradients:
        q.gradients === 'off'
          ? null
          : {
              interval_s: q.gradient_interval_s,
              random_walk_m_per_sqrt_h: q.gradient_random_walk_m_per_sqrt_h,
              apriori_sigma_m: q.gradient_apriori_sigma_m,
            },
      epoch_bias: q.epoch_bias,
      weighting: q.weighting,
      sigma0_m: q.sigma0_m,
      elevation_cutoff_deg: q.elevation_cutoff_deg,
      outlier_threshold: q.outlier_threshold,
      outlier_rejection: q.outlier_rejection,
      max_rejections: q.max_rejections,
      scale_sigmas: q.scale_sigmas,
    },
  };
}
