import type { FastifyPluginAsyncZod } from 'fastify-type-provider-zod';
import type { SeriesCoverage } from '../../storage/coverage-query.js';
import { HttpProblem } from '../problem.js';
import { problemSchema } from '../schemas/common.js';
import { networkCoverageQuery, networkCoverageResponse } from '../schemas/network-coverage.js';
import { rangeEndMs, rangeStartMs } from '../schemas/range-bounds.js';
import { selectStations } from './network-precipitable-water.js';
import { isoEpoch, stationPlaceFields } from './station-common.js';

/** Earliest and latest representable epochs of the stored series [ms] (no range given). */
const ALL_TIME: [number, number] = [Number.MIN_SAFE_INTEGER, Number.MAX_SAFE_INTEGER];

const seriesJson = (c: SeriesCoverage) => ({
  source: c.source,
  first_epoch: isoEpoch(c.firstMs),
  last_epoch: isoEpoch(c.lastMs),
  record_count: c.recordCount,
  gap_count: c.gapCount,
  gap_total_s: c.gapTotalMs / 1000,
  gaps: c.gaps.map((g) => ({ from: isoEpoch(g.fromMs), to: isoEpoch(g.toMs), length_s: (g.toMs - g.fromMs) / 1000 })),
});

const networkCoverageRoute: FastifyPluginAsyncZod = async (app) => {
  app.get(
    '/v1/network/coverage',
    {
      schema: {
        summary: 'Data coverage per station and source: first and last epoch, record count, gaps',
        description: [
          'What the archive holds of the delay series (from which PWV is computed), per station and source: first and last epoch, record count, and the gaps — spacings between consecutive records longer than `gap_min_s` (default 1 h).',
          'Stations: all, a list (`stations`) or those inside `bbox`, as for GET /v1/network/precipitable-water; every selected station appears, with `sources: []` when it holds no record in the range.',
          'Computed in the database (aggregates and a window over each series), so a station-year costs one scan, not one row per record through the service. Gaps before the first or after the last record of the range are not counted (first_epoch and last_epoch show them).',
        ].join('\n'),
        tags: ['station archive', 'water vapour'],
        querystring: networkCoverageQuery,
        response: { 200: networkCoverageResponse, 400: problemSchema, 404: problemSchema },
      },
    },
    async (request) => {
      const q = request.query;
      const fromMs = q.from === undefined ? ALL_TIME[0] : rangeStartMs(q.from);
      const toMs = q.to === undefined ? ALL_TIME[1] : rangeEndMs(q.to);
      if (fromMs > toMs) {
        throw new HttpProblem(400, `query.from (${q.from}) must not be after query.to (${q.to})`, [
          { field: 'query.from', message: 'must be at or before query.to' },
        ]);
      }
      const stations = await selectStations(app.repository, q.stations, q.bbox);
      const coverage = await app.repository.readDelayCoverage({
        stationIds: stations.map((s) => s.stationId),
        fromMs,
        toMs,
        gapMinMs: q.gap_min_s * 1000,
        maxGaps: q.max_gaps,
      });
      const all = [...coverage.values()].flat();
      return {
        from: q.from === undefined ? null : isoEpoch(fromMs),
        to: q.to === undefined ? null : isoEpoch(toMs),
        gap_min_s: q.gap_min_s,
        max_gaps: q.max_gaps,
        series: 'delays' as const,
        stations: stations.map((s) => ({
          station_id: s.stationId,
          name: s.name,
          ...stationPlaceFields(s),
          sources: (coverage.get(s.stationId) ?? []).map(seriesJson),
        })),
        summary: {
          station_count: stations.length,
          stations_with_records: coverage.size,
          source_series: all.length,
          record_count: all.reduce((n, c) => n + c.recordCount, 0),
          gap_count: all.reduce((n, c) => n + c.gapCount, 0),
          first_epoch: all.length ? isoEpoch(Math.min(...all.map((c) => c.firstMs))) : null,
          last_epoch: all.length ? isoEpoch(Math.max(...all.map((c) => c.lastMs))) : null,
        },
      };
    },
  );
};

export default networkCoverageRoute;
