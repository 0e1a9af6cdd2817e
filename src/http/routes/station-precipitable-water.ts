import type { FastifyPluginAsyncZod } from 'fastify-type-provider-zod';
import { ModelSetSpans } from '../../services/homogeneity.js';
import type { SurfaceMetRow, ZenithDelayRow } from '../../storage/repository.js';
import { CSV_TYPE, csvPieces, JSON_TYPE, jsonRecordPieces } from '../series-pieces.js';
import { loopFriendlyPages, loopFriendlySlices, sendPieces } from '../streamed-answer.js';
import { roundedDecimalText } from '../../formats/decimal-text.js';
import { csvCell } from '../../formats/met-csv.js';
import {
  recordWarningCell,
  retrievalProvenance,
  stationPwvRetrieval,
  type StationPwvRecord,
  type StationPwvRetrieval,
} from '../../services/station-pwv.js';
import { OUTPUT_DECIMALS, roundTo as round } from '../../formats/output-precision.js';
import { DEFAULT_MAX_MET_GAP_MS } from '../../domain/meteo/met-interpolation.js';
import { HttpProblem } from '../problem.js';
import { problemSchema } from '../schemas/common.js';
import { STATION_PWV_CSV_COLUMNS, stationPwvQuery, stationPwvResponse } from '../schemas/station-precipitable-water.js';
import { stationParams } from '../schemas/stations.js';
import { isoEpoch, requireStation, type StationRouteOptions } from './station-common.js';
import { resolveSeriesRange } from './series-range.js';
import { modelFingerprintHeaders } from '../fingerprint-headers.js';

/** Output precision: the one table, src/formats/output-precision.ts. */
export { OUTPUT_DECIMALS };
const D = OUTPUT_DECIMALS;

const pwvJson = (r: StationPwvRecord) => ({
  epoch: isoEpoch(r.epochMs),
  source: r.source,
  model_fingerprint: r.modelFingerprint,
  ztd_m: r.ztdM,
  ztd_sigma_m: r.ztdSigmaM,
  pressure_hpa: round(r.pressureHpa, D.hpa),
  temperature_c: round(r.temperatureC, D.k),
  zhd_m: round(r.zhdM, D.m),
  zwd_m: round(r.zwdM, D.m),
  zwd_sigma_m: round(r.zwdSigmaM, D.m),
  tm_k: round(r.tmK, D.k),
  tm_sigma_k: round(r.tmSigmaK, D.k),
  conversion_factor: round(r.conversionFactor, D.pi),
  pwv_mm: round(r.pwvMm, D.mm),
  pwv_sigma_mm: round(r.pwvSigmaMm, D.mm),
  quality: r.quality,
  pressure_quality: r.pressureQuality,
  temperature_quality: r.temperatureQuality,
});

/**
 * Cells of one CSV column: empty for null, else the text String(round(x, digits)) would give (or
 * String(x) without `digits`). The text of the last value is kept, because sigmas and Tm sigma
 * repeat row after row (a pure memo: the same value always gives the same text).
 */
function csvColumn(digits?: number): (x: number | null) => string {
  let lastValue: number | null = null;
  let lastText = '';
  return (x) => {
    if (x === null) return '';
    if (x !== lastValue) {
      lastValue = x;
      lastText = digits === undefined ? String(x) : roundedDecimalText(x, digits);
    }
    return lastText;
  };
}
const cell = {
  ztdSigma: csvColumn(),
  pressure: csvColumn(D.hpa),
  temperature: csvColumn(D.k),
  zhd: csvColumn(D.m),
  zwd: csvColumn(D.m),
  zwdSigma: csvColumn(D.m),
  tm: csvColumn(D.k),
  tmSigma: csvColumn(D.k),
  conversionFactor: csvColumn(D.pi),
  pwv: csvColumn(D.mm),
  pwvSigma: csvColumn(D.mm),
};

/**
 * One CSV line in the order of STATION_PWV_CSV_COLUMNS (a test checks it against the JSON record).
 * Array.join makes one flat string, about three times faster here than a template of many parts.
 */
const pwvCsvLine = (r: StationPwvRecord): string =>
  [
    isoEpoch(r.epochMs),
    csvCell(r.source),
    r.modelFingerprint,
    r.ztdM,
    cell.ztdSigma(r.ztdSigmaM),
    cell.pressure(r.pressureHpa),
    cell.temperature(r.temperatureC),
    cell.zhd(r.zhdM),
    cell.zwd(r.zwdM),
    cell.zwdSigma(r.zwdSigmaM),
    cell.tm(r.tmK),
    cell.tmSigma(r.tmSigmaK),
    cell.conversionFactor(r.conversionFactor),
    cell.pwv(r.pwvMm),
    cell.pwvSigma(r.pwvSigmaMm),
    r.quality,
    r.pressureQuality,
    r.temperatureQuality,
    recordWarningCell(r),
  ].join(',');

/**
 * The met gap limit [s]: met_max_gap_s (the name the estimation uses), or its deprecated alias
 * max_met_gap_s with a warning; both with different values is a 400.
 */
function metGapSetting(q: { met_max_gap_s?: number | undefined; max_met_gap_s?: number | undefined }): {
  seconds: number;
  warnings: string[];
} {
  if (q.max_met_gap_s === undefined) return { seconds: q.met_max_gap_s ?? DEFAULT_MAX_MET_GAP_MS / 1000, warnings: [] };
  if (q.met_max_gap_s !== undefined && q.met_max_gap_s !== q.max_met_gap_s) {
    throw new HttpProblem(400, 'query.max_met_gap_s: differs from query.met_max_gap_s; send only met_max_gap_s', [
      { field: 'query.max_met_gap_s', message: 'deprecated alias of met_max_gap_s; send only met_max_gap_s' },
    ]);
  }
  return {
    seconds: q.max_met_gap_s,
    warnings: ['query.max_met_gap_s is deprecated: use met_max_gap_s (the same setting under the name the ZWD estimation uses)'],
  };
}

/** The records of the retrieval, a slice of at most READ_PAGE_ROWS at a time, the loop yielded between slices. */
async function* computedSlices(retrieval: StationPwvRetrieval, n: number): AsyncGenerator<StationPwvRecord[], void, undefined> {
  for await (const [start, end] of loopFriendlySlices(n)) yield retrieval.records(start, end);
}

const stationPwvRoute: FastifyPluginAsyncZod<StationRouteOptions> = async (app, options) => {
  app.get(
    '/v1/stations/:station_id/precipitable-water',
    {
      schema: {
        summary: 'Precipitable water for the stored delays of a station',
        description: [
          'For each stored delay epoch in the range: pressure and temperature interpolated linearly in time from the stored met series (not across gaps longer than met_max_gap_s, default 3 h; never extrapolated), reduced from met_height_m to the antenna height; ZHD (Saastamoinen/Davis 1985), ZWD = ZTD − ZHD, Tm (Bevis et al. 1992), PWV = Π(Tm)·ZWD (Bevis et al. 1994) and its sigma.',
          'Quality flag per record, most severe first: met-missing (no PWV: no pressure or temperature within the gap limit), delay-sigma-large (ztd_sigma_m > max_ztd_sigma_m, default 0.01 m), delay-sigma-unknown (no ztd_sigma_m; pwv_sigma_mm null), met-interpolated, ok.',
          `\`homogeneous\` is false when the delays of the range come from more than one model set. One request reads at most ${options.maxReadRangeDays} days. format=csv answers text/csv with a header row of the record field names and the headers x-homogeneous and x-model-fingerprints.`,
        ].join('\n'),
        tags: ['station archive', 'water vapour'],
        params: stationParams,
        querystring: stationPwvQuery,
        response: {
          200: stationPwvResponse,
          400: problemSchema,
          401: problemSchema,
          403: problemSchema,
          404: problemSchema,
          503: problemSchema,
        },
      },
    },
    async (request, reply) => {
      const stationId = request.params.station_id;
      const q = request.query;
      const station = await requireStation(app.repository, stationId);
      const range = await resolveSeriesRange(app.repository, stationId, 'delays', q, options.maxReadRangeDays);
      const gap = metGapSetting(q);
      const maxMetGapMs = gap.seconds * 1000;
      // The delays and met of the range, read page by page (the model sets gathered on the way).
      const spans = new ModelSetSpans();
      const delays: ZenithDelayRow[] = [];
      for await (const page of loopFriendlyPages(app.repository, 'zenith-delays', stationId, range, { source: q.source })) {
        spans.add(page);
        for (const row of page) delays.push(row);
      }
      const met: SurfaceMetRow[] = [];
      if (delays.length) {
        const metRange = { fromMs: delays[0]!.epochMs - maxMetGapMs, toMs: delays[delays.length - 1]!.epochMs + maxMetGapMs };
        for await (const page of loopFriendlyPages(app.repository, 'surface-met', stationId, metRange, { source: q.met_source }))
          for (const row of page) met.push(row);
      }
      const retrieval = stationPwvRetrieval(station, delays, met, { maxMetGapMs, maxZtdSigmaM: q.max_ztd_sigma_m });
      const fingerprints = spans.fingerprints();
      const summary = spans.summary(await app.repository.readModelSets(fingerprints));
      // The records are computed, shaped and serialised a slice at a time, with the loop yielded between slices.
      const slices = computedSlices(retrieval, delays.length);
      if (q.format === 'csv') {
        // Straight from the computed records to text: no intermediate objects for a station-year.
        return sendPieces(
          reply,
          CSV_TYPE,
          csvPieces(STATION_PWV_CSV_COLUMNS, slices, (records) => records.map(pwvCsvLine)),
          {
            'x-homogeneous': String(summary.homogeneous),
            ...modelFingerprintHeaders(fingerprints),
          },
        );
      }
      const head = { station_id: stationId, from: isoEpoch(range.fromMs), to: isoEpoch(range.toMs) };
      return sendPieces(
        reply,
        JSON_TYPE,
        jsonRecordPieces(head, slices, pwvJson, () => ({
          homogeneous: summary.homogeneous,
          model_sets: summary.model_sets,
          warnings: [...summary.warnings, ...retrieval.warnings(), ...gap.warnings],
          retrieval: {
            ...retrievalProvenance(maxMetGapMs),
            met_max_gap_s: gap.seconds,
            max_met_gap_s: gap.seconds,
            max_ztd_sigma_m: q.max_ztd_sigma_m,
          },
        })),
      );
    },
  );
};

export default stationPwvRoute;
