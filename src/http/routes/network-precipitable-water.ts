import type { FastifyReply } from 'fastify';
import type { FastifyPluginAsyncZod } from 'fastify-type-provider-zod';
import { DEFAULT_MAX_MET_GAP_MS } from '../../domain/meteo/met-interpolation.js';
import { csvCell } from '../../formats/met-csv.js';
import { intervalMeans, type IntervalMean } from '../../services/interval-means.js';
import { networkStationPwv, type NetworkStationPwv, type SourceChoice } from '../../services/network-pwv.js';
import { summariseModelSets } from '../../services/homogeneity.js';
import { PWV_QUALITY_FLAGS, recordWarningCell, retrievalProvenance, type StationPwvRecord } from '../../services/station-pwv.js';
import type { Repository, Station, StationRange, ZenithDelayRow } from '../../storage/repository.js';
import { intervalsNetcdf, recordsNetcdf } from '../network-netcdf.js';
import { HttpProblem } from '../problem.js';
import { problemSchema } from '../schemas/common.js';
import {
  NETWORK_INTERVAL_CSV_COLUMNS,
  NETWORK_PWV_CSV_COLUMNS,
  networkPwvQuery,
  networkPwvResponse,
  type BoundingBox,
} from '../schemas/network-precipitable-water.js';
import { rangeEndMs, rangeStartMs } from '../schemas/range-bounds.js';
import { OUTPUT_DECIMALS, fixedCell as fixed, roundTo as round } from '../../formats/output-precision.js';
import { isoEpoch, sendCsv, stationPlaceFields, type StationRouteOptions } from './station-common.js';
import { DAY_MS } from './series-range.js';

const D = OUTPUT_DECIMALS;
/** Longitude in (−180, 180] [deg] (stations may be stored in 0..360). */
const wrapLongitude = (lon: number) => (lon > 180 ? lon - 360 : lon);

export function insideBox(s: Station, box: BoundingBox): boolean {
  if (s.latitudeDeg < box.southDeg || s.latitudeDeg > box.northDeg) return false;
  const lon = wrapLongitude(s.longitudeDeg);
  return box.westDeg <= box.eastDeg ? lon >= box.westDeg && lon <= box.eastDeg : lon >= box.westDeg || lon <= box.eastDeg;
}

/**
 * The stations of a network read: all live ones, or those named (404 naming the unknown ids; only they
 * are read, Repository.getStations), then those inside the box (Repository.listStationsInBox without
 * ids). Order: by id, or as named.
 */
export async function selectStations(repository: Repository, ids?: readonly string[], box?: BoundingBox): Promise<Station[]> {
  // Without ids: the box is tested in the database (the same test as insideBox), else every station.
  if (ids === undefined) return box === undefined ? repository.listStations() : repository.listStationsInBox(box);
  const byId = await repository.getStations(ids);
  const unknown = ids.filter((id) => !byId.has(id));
  if (unknown.length > 0) {
    throw new HttpProblem(
      404,
      `no station ${unknown
        .slice(0, 10)
        .map((id) => `"${id}"`)
        .join(', ')}${unknown.length > 10 ? ` and ${unknown.length - 10} more` : ''}; GET /v1/stations lists them`,
      [{ field: 'query.stations', message: `unknown station id(s): ${unknown.slice(0, 10).join(', ')}` }],
    );
  }
  const stations = ids.map((id) => byId.get(id)!);
  return box === undefined ? stations : stations.filter((s) => insideBox(s, box));
}

type Query = typeof networkPwvQuery._zod.output;

/** Which time selection the query makes; exactly one of epoch, from/to, since, latest=true. */
function timeMode(q: Query): 'epoch' | 'range' | 'since' | 'latest' {
  const given = [
    q.epoch !== undefined && 'epoch',
    (q.from !== undefined || q.to !== undefined) && 'range',
    q.since !== undefined && 'since',
    q.latest === true && 'latest',
  ].filter((x): x is 'epoch' | 'range' | 'since' | 'latest' => x !== false);
  if (given.length !== 1) {
    throw new HttpProblem(
      400,
      `give exactly one of: epoch, from (with optional to), since, latest=true (got ${given.length === 0 ? 'none' : given.join(' and ')})`,
      [{ field: 'query.epoch', message: 'exactly one of epoch, from/to, since, latest=true' }],
    );
  }
  if (given[0] === 'range' && q.from === undefined) {
    throw new HttpProblem(400, 'query.to needs query.from', [{ field: 'query.from', message: 'required with query.to' }]);
  }
  return given[0]!;
}

const recordJson = (stationId: string, r: StationPwvRecord) => ({
  station_id: stationId,
  epoch: isoEpoch(r.epochMs),
  source: r.source,
  model_fingerprint: r.modelFingerprint,
  ztd_m: r.ztdM,
  ztd_sigma_m: r.ztdSigmaM,
  pressure_hpa: round(r.pressureHpa, D.hpa),
  temperature_c: round(r.temperatureC, D.k),
  pwv_mm: round(r.pwvMm, D.mm),
  pwv_sigma_mm: round(r.pwvSigmaMm, D.mm),
  quality: r.quality,
});

const intervalJson = (stationId: string, m: IntervalMean, intervalMs: number) => ({
  station_id: stationId,
  epoch: isoEpoch(m.startMs),
  interval_end: isoEpoch(m.startMs + intervalMs),
  sources: m.sources,
  count: m.count,
  excluded_count: m.excludedCount,
  pwv_mm: round(m.pwvMm, D.mm),
  pwv_sigma_mm: round(m.pwvSigmaMm, D.mm),
  pwv_sd_mm: round(m.pwvSdMm, D.mm),
  ztd_count: m.ztdCount,
  ztd_m: round(m.ztdM, D.m),
  ztd_sigma_m: round(m.ztdSigmaM, D.m),
  ztd_sd_m: round(m.ztdSdM, D.m),
  quality_counts: m.qualityCounts,
});

/** Interval means of one station: per source with source=all (never a mean across producers). */
function stationIntervals(result: NetworkStationPwv, intervalMs: number, perSource: boolean): IntervalMean[] {
  if (!perSource) return intervalMeans(result.records, intervalMs);
  const out: IntervalMean[] = [];
  for (const source of [...result.sources].sort())
    out.push(
      ...intervalMeans(
        result.records.filter((r) => r.source === source),
        intervalMs,
      ),
    );
  return out.sort((a, b) => a.startMs - b.startMs);
}

const networkPwvRoute: FastifyPluginAsyncZod<StationRouteOptions> = async (app, options) => {
  const maxStationDays = options.maxReadRangeDays;
  app.get(
    '/v1/network/precipitable-water',
    {
      schema: {
        summary: 'PWV and ZTD of many stations in one call (at an epoch, over a range, since an epoch, latest; records or interval means)',
        description: [
          "Stations: all, a list (`stations`), or those inside `bbox`. Time: exactly one of `epoch`, `from`/`to`, `since` (exclusive; up to each station's latest delay epoch), `latest=true` (each station's latest delay epoch). Dates alone are whole UTC days.",
          'PWV per record as GET /v1/stations/{station_id}/precipitable-water computes it: met interpolated in time (not across gaps longer than met_max_gap_s) and reduced to the antenna height; ZHD (Saastamoinen/Davis 1985), ZWD = ZTD − ZHD, Tm (Bevis et al. 1992), PWV = Π(Tm)·ZWD (Bevis et al. 1994).',
          'Quality flags, most severe first: met-missing (no PWV), delay-sigma-large (ztd_sigma_m > max_ztd_sigma_m), delay-sigma-unknown (no pwv_sigma_mm), met-interpolated, ok.',
          "Sources: by default one value per station and epoch, from the best-ranked source present at that epoch; a station's sources are ranked by their number of delay rows over the whole UTC day(s) of the range (most first, ties by name) and listed in that order in `stations[].sources`. `source=all` gives every row; `source=<name>` one source.",
          'Aggregation (`interval`, e.g. PT1H): means over [start, start + interval) aligned on 00:00 UTC; see the interval parameter and the intervals[] fields for the method of σ.',
          `Limit: the stations' ranges add up to at most ${maxStationDays} station-days per request (e.g. 1000 stations × ${((maxStationDays / 1000) * 24).toFixed(1)} h). format=csv answers text/csv (an attachment) with the station coordinates on every row; format=netcdf a CF-1.8 timeSeries netCDF file.`,
        ].join('\n'),
        tags: ['station archive', 'water vapour'],
        querystring: networkPwvQuery,
        response: { 200: networkPwvResponse, 400: problemSchema, 404: problemSchema },
      },
    },
    async (request, reply) => {
      const q = request.query;
      const mode = timeMode(q);
      const intervalMs = q.interval === undefined ? null : q.interval * 1000;

      const stations = await selectStations(app.repository, q.stations, q.bbox);

      /** [start, end] of the interval that holds t (or [t, t] without interval). */
      const around = (t: number): [number, number] =>
        intervalMs === null ? [t, t] : [Math.floor(t / intervalMs) * intervalMs, Math.floor(t / intervalMs) * intervalMs + intervalMs - 1];
      const ranges: StationRange[] = [];
      if (mode === 'epoch') {
        const [fromMs, toMs] = around(rangeStartMs(q.epoch!));
        for (const s of stations) ranges.push({ stationId: s.stationId, fromMs, toMs });
      } else if (mode === 'range') {
        const fromMs = rangeStartMs(q.from!);
        let toMs: number;
        if (q.to !== undefined) toMs = rangeEndMs(q.to);
        else {
          const latestByStation = await app.repository.latestEpochsMs(
            stations.map((s) => s.stationId),
            'delays',
          );
          toMs = Math.max(fromMs, ...latestByStation.values());
        }
        if (fromMs > toMs) {
          throw new HttpProblem(400, `query.from (${q.from}) must not be after query.to (${q.to})`, [
            { field: 'query.from', message: 'must be at or before query.to' },
          ]);
        }
        for (const s of stations) ranges.push({ stationId: s.stationId, fromMs, toMs });
      } else {
        const latestByStation = await app.repository.latestEpochsMs(
          stations.map((s) => s.stationId),
          'delays',
        );
        const sinceMs = mode === 'since' ? rangeEndMs(q.since!) + 1 : null;
        for (const s of stations) {
          const latestMs = latestByStation.get(s.stationId);
          if (latestMs === undefined) continue;
          if (sinceMs === null) {
            const [fromMs, toMs] = around(latestMs);
            ranges.push({ stationId: s.stationId, fromMs, toMs });
          } else if (latestMs >= sinceMs) ranges.push({ stationId: s.stationId, fromMs: sinceMs, toMs: latestMs });
        }
      }
      const stationDays = ranges.reduce((sum, r) => sum + (r.toMs - r.fromMs) / DAY_MS, 0);
      if (stationDays > maxStationDays) {
        throw new HttpProblem(
          400,
          `the request spans ${stationDays.toFixed(1)} station-days (${ranges.length} stations); one request reads at most ${maxStationDays} station-days: narrow the range or the stations (bbox, stations)`,
          [
            {
              field: mode === 'since' ? 'query.since' : 'query.to',
              message: `the stations' ranges must add up to at most ${maxStationDays} days`,
            },
          ],
        );
      }

      const choice: SourceChoice =
        q.source === undefined ? { kind: 'preferred' } : q.source === 'all' ? { kind: 'all' } : { kind: 'one', source: q.source };
      const maxMetGapMs = (q.met_max_gap_s ?? DEFAULT_MAX_MET_GAP_MS / 1000) * 1000;
      const delaysByStation = await app.repository.readZenithDelaysMany(ranges, choice.kind === 'one' ? choice.source : undefined);
      const metRanges: StationRange[] = [];
      for (const [stationId, rows] of delaysByStation) {
        metRanges.push({ stationId, fromMs: rows[0]!.epochMs - maxMetGapMs, toMs: rows[rows.length - 1]!.epochMs + maxMetGapMs });
      }
      const metByStation = await app.repository.readSurfaceMetMany(metRanges);
      // Ranking window of the source preference: the whole UTC days of the range, counted only where two sources meet.
      const rankRanges: StationRange[] = [];
      if (choice.kind === 'preferred') {
        for (const r of ranges) {
          const rows = delaysByStation.get(r.stationId);
          if (rows && rows.some((d) => d.source !== rows[0]!.source)) {
            rankRanges.push({
              stationId: r.stationId,
              fromMs: Math.floor(r.fromMs / DAY_MS) * DAY_MS,
              toMs: Math.floor(r.toMs / DAY_MS) * DAY_MS + DAY_MS - 1,
            });
          }
        }
      }
      const sourceCounts = await app.repository.countDelaySources(rankRanges);

      const results: NetworkStationPwv[] = [];
      const usedDelays: ZenithDelayRow[] = [];
      const warnings: string[] = [];
      // Every selected station appears in `stations`, also those with nothing in their range (or no series at all).
      for (const s of stations) {
        const rows = delaysByStation.get(s.stationId) ?? [];
        const result = networkStationPwv(
          s,
          rows,
          metByStation.get(s.stationId) ?? [],
          choice,
          {
            maxMetGapMs,
            maxZtdSigmaM: q.max_ztd_sigma_m,
          },
          sourceCounts.get(s.stationId),
        );
        results.push(result);
        for (const d of result.delays) usedDelays.push(d);
        warnings.push(...result.warnings);
      }
      const fingerprints = [...new Set(usedDelays.map((d) => d.modelFingerprint))];
      const summary = summariseModelSets(usedDelays, await app.repository.readModelSets(fingerprints));
      const intervalsByStation =
        intervalMs === null ? null : results.map((res) => stationIntervals(res, intervalMs, choice.kind === 'all'));

      const fromMs = ranges.length ? Math.min(...ranges.map((r) => r.fromMs)) : mode === 'epoch' ? rangeStartMs(q.epoch!) : Date.now();
      const toMs = ranges.length ? Math.max(...ranges.map((r) => r.toMs)) : fromMs;
      const rangeOf = new Map(ranges.map((r) => [r.stationId, r]));

      if (q.format === 'netcdf') {
        if (choice.kind === 'all') {
          throw new HttpProblem(
            400,
            'format=netcdf holds one value per station and epoch: use the default source preference or one source',
            [{ field: 'query.format', message: 'netcdf is not available with source=all' }],
          );
        }
        const hasData =
          intervalsByStation === null ? results.some((r) => r.records.length > 0) : intervalsByStation.some((l) => l.length > 0);
        if (!hasData)
          throw new HttpProblem(404, 'no records in the range for the selected stations: nothing to write as netCDF', [
            { field: 'query.format', message: 'no data to write' },
          ]);
        const ctx = {
          requestUrl: request.url,
          modelFingerprints: fingerprints,
          retrievalFingerprint: retrievalProvenance(maxMetGapMs).model_fingerprint,
        };
        const bytes =
          intervalsByStation === null ? recordsNetcdf(results, ctx) : intervalsNetcdf(results, intervalsByStation, intervalMs! / 1000, ctx);
        const stamp = isoEpoch(fromMs).slice(0, 16).replace(/[-:]/g, '');
        reply
          .header(
            'content-disposition',
            `attachment; filename="network-pwv-${stamp}${intervalMs === null ? '' : `-${intervalMs / 1000}s`}.nc"`,
          )
          .header('x-homogeneous', String(summary.homogeneous))
          .type('application/x-netcdf');
        // A binary body: sent past the JSON response schema (which describes format=json).
        return (reply as FastifyReply).send(Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength));
      }
      if (q.format === 'csv') {
        const lines: string[] = [];
        const header = intervalMs === null ? NETWORK_PWV_CSV_COLUMNS : NETWORK_INTERVAL_CSV_COLUMNS;
        results.forEach((res, k) => {
          const s = res.station;
          const p = stationPlaceFields(s);
          const place = [
            csvCell(s.stationId),
            fixed(p.latitude_deg, D.deg),
            fixed(p.longitude_deg, D.deg),
            fixed(p.height_m, D.heightM),
            fixed(p.geoid_undulation_m, D.geoidM),
            fixed(p.altitude_m, D.geoidM),
          ].join(',');
          if (intervalsByStation === null) {
            for (const rec of res.records) {
              lines.push(
                `${place},${[isoEpoch(rec.epochMs), csvCell(rec.source), rec.modelFingerprint, fixed(rec.ztdM, D.m), fixed(rec.ztdSigmaM, D.m), fixed(rec.pressureHpa, D.hpa), fixed(rec.temperatureC, D.k), fixed(rec.pwvMm, D.mm), fixed(rec.pwvSigmaMm, D.mm), rec.quality, recordWarningCell(rec)].join(',')}`,
              );
            }
          } else {
            for (const m of intervalsByStation[k]!) {
              const cells = [
                isoEpoch(m.startMs),
                isoEpoch(m.startMs + intervalMs!),
                m.count,
                m.excludedCount,
                fixed(m.pwvMm, D.mm),
                fixed(m.pwvSigmaMm, D.mm),
                fixed(m.pwvSdMm, D.mm),
                m.ztdCount,
                fixed(m.ztdM, D.m),
                fixed(m.ztdSigmaM, D.m),
                fixed(m.ztdSdM, D.m),
                csvCell(m.sources.join(' ')),
                ...PWV_QUALITY_FLAGS.map((f) => m.qualityCounts[f]),
                m.warningCodes.join(';'),
              ];
              lines.push(`${place},${cells.join(',')}`);
            }
          }
        });
        const stamp = isoEpoch(fromMs).slice(0, 16).replace(/[-:]/g, '');
        return sendCsv(reply, header, lines, (line) => line, {
          'content-disposition': `attachment; filename="network-pwv-${stamp}${intervalMs === null ? '' : `-${intervalMs / 1000}s`}.csv"`,
          'x-homogeneous': String(summary.homogeneous),
          'x-model-fingerprints': fingerprints.join(','),
        });
      }

      const retrieval = retrievalProvenance(maxMetGapMs);
      return {
        from: isoEpoch(fromMs),
        to: isoEpoch(toMs),
        interval_s: intervalMs === null ? null : intervalMs / 1000,
        source: choice.kind === 'one' ? choice.source : choice.kind,
        stations: results.map((res, k) => {
          const s = res.station;
          const range = rangeOf.get(s.stationId);
          return {
            station_id: s.stationId,
            name: s.name,
            ...stationPlaceFields(s),
            from: range ? isoEpoch(range.fromMs) : null,
            to: range ? isoEpoch(range.toMs) : null,
            sources: res.sources,
            record_count: intervalsByStation === null ? res.records.length : intervalsByStation[k]!.length,
          };
        }),
        records: intervalsByStation === null ? results.flatMap((res) => res.records.map((r) => recordJson(res.station.stationId, r))) : [],
        intervals:
          intervalsByStation === null
            ? []
            : results.flatMap((res, k) => intervalsByStation[k]!.map((m) => intervalJson(res.station.stationId, m, intervalMs!))),
        homogeneous: summary.homogeneous,
        model_sets: summary.model_sets,
        warnings: [...summary.warnings, ...warnings],
        retrieval: { ...retrieval, met_max_gap_s: maxMetGapMs / 1000, max_ztd_sigma_m: q.max_ztd_sigma_m },
      };
    },
  );
};

export default networkPwvRoute;
