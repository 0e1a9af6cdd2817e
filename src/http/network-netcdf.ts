/**
 * The network answer as a CF netCDF file (src/formats/pwv-netcdf.ts): the stations of the answer
 * on the union of their epochs (or interval starts), one value per station and epoch.
 */

import { writePwvNetcdf, type NetcdfQuantity, type NetcdfStation } from '../formats/pwv-netcdf.js';
import type { IntervalMean } from '../services/interval-means.js';
import type { NetworkStationPwv } from '../services/network-pwv.js';
import { PWV_QUALITY_FLAGS } from '../services/station-pwv.js';
import type { Station } from '../storage/repository.js';
import { SERVICE_VERSION } from '../version.js';
import { stationPlaceFields } from './routes/station-common.js';

export interface NetworkNetcdfContext {
  /** The request, for the history attribute (path and query). */
  requestUrl: string;
  modelFingerprints: string[];
  retrievalFingerprint: string;
}

const REFERENCES =
  'ZHD: Saastamoinen (1972) with Davis et al. (1985); Tm: Bevis et al. (1992), J. Geophys. Res. 97(D14); PWV = Pi(Tm) ZWD: Bevis et al. (1994), J. Appl. Meteorol. 33(3)';
const CAUTION = 'Research and monitoring values: not for safety-of-life decisions or for issuing weather warnings.';

/** The station with its altitude and geoid undulation, as the JSON and CSV answers give them. */
function netcdfStation(s: Station): NetcdfStation {
  const place = stationPlaceFields(s);
  return { ...s, geoidUndulationM: place.geoid_undulation_m, altitudeM: place.altitude_m };
}

function timeAxis(epochLists: number[][]): { times: number[]; index: Map<number, number> } {
  const all = new Set<number>();
  for (const list of epochLists) for (const t of list) all.add(t);
  const times = [...all].sort((a, b) => a - b);
  return { times, index: new Map(times.map((t, i) => [t, i])) };
}

function globals(ctx: NetworkNetcdfContext, what: string): Record<string, string> {
  return {
    institution: 'produced by a tropodelay service instance',
    source: `tropodelay ${SERVICE_VERSION}: ${what}`,
    history: `${new Date().toISOString()} written by GET ${ctx.requestUrl}`,
    references: REFERENCES,
    comment: CAUTION,
    delay_model_fingerprints: ctx.modelFingerprints.join(' '),
    retrieval_model_fingerprint: ctx.retrievalFingerprint,
  };
}

/** Records (one per station and epoch): pwv, pwv_sigma, ztd, ztd_sigma, met, quality_flag. */
export function recordsNetcdf(results: readonly NetworkStationPwv[], ctx: NetworkNetcdfContext): Uint8Array {
  const { times, index } = timeAxis(results.map((r) => r.records.map((x) => x.epochMs)));
  const nTime = times.length;
  const cells = results.length * nTime;
  const keys = ['pwv', 'pwv_sigma', 'ztd', 'ztd_sigma', 'air_pressure', 'air_temperature'] as const;
  const columns = Object.fromEntries(keys.map((k) => [k, new Array<number | null>(cells).fill(null)])) as Record<
    (typeof keys)[number],
    (number | null)[]
  >;
  const flags: (number | null)[] = new Array(cells).fill(null);
  const flagIndex = new Map(PWV_QUALITY_FLAGS.map((q, i) => [q, i]));
  results.forEach((res, s) => {
    for (const r of res.records) {
      const at = s * nTime + index.get(r.epochMs)!;
      columns.pwv[at] = r.pwvMm;
      columns.pwv_sigma[at] = r.pwvSigmaMm;
      columns.ztd[at] = r.ztdM;
      columns.ztd_sigma[at] = r.ztdSigmaM;
      columns.air_pressure[at] = r.pressureHpa;
      columns.air_temperature[at] = r.temperatureC;
      flags[at] = flagIndex.get(r.quality)!;
    }
  });
  return writePwvNetcdf({
    title: 'GNSS precipitable water vapour and zenith total delay per station',
    stations: results.map((r) => netcdfStation(r.station)),
    timesMs: times,
    intervalS: null,
    quantities: keys.map((key): NetcdfQuantity => ({ key, values: columns[key] })),
    flags: { values: flags, meanings: PWV_QUALITY_FLAGS },
    globals: globals(ctx, 'PWV per stored delay epoch from the stored ZTD and met series'),
  });
}

/** Interval means: pwv, pwv_sigma (σ of the mean), pwv_sd, count, ztd, ztd_sigma with time_bnds. */
export function intervalsNetcdf(
  results: readonly NetworkStationPwv[],
  intervals: readonly IntervalMean[][],
  intervalS: number,
  ctx: NetworkNetcdfContext,
): Uint8Array {
  const { times, index } = timeAxis(intervals.map((list) => list.map((m) => m.startMs)));
  const nTime = times.length;
  const cells = results.length * nTime;
  const keys = ['pwv', 'pwv_sigma', 'pwv_sd', 'count', 'ztd', 'ztd_sigma'] as const;
  const columns = Object.fromEntries(keys.map((k) => [k, new Array<number | null>(cells).fill(null)])) as Record<
    (typeof keys)[number],
    (number | null)[]
  >;
  intervals.forEach((list, s) => {
    for (const m of list) {
      const at = s * nTime + index.get(m.startMs)!;
      columns.pwv[at] = m.pwvMm;
      columns.pwv_sigma[at] = m.pwvSigmaMm;
      columns.pwv_sd[at] = m.pwvSdMm;
      columns.count[at] = m.count;
      columns.ztd[at] = m.ztdM;
      columns.ztd_sigma[at] = m.ztdSigmaM;
    }
  });
  return writePwvNetcdf({
    title: `GNSS precipitable water vapour, means over ${intervalS} s intervals per station`,
    stations: results.map((r) => netcdfStation(r.station)),
    timesMs: times,
    intervalS,
    quantities: keys.map((key) => ({ key, values: columns[key] })),
    flags: null,
    globals: {
      ...globals(ctx, `means of the PWV records over [start, start + ${intervalS} s) aligned on 00:00 UTC`),
      averaging_method:
        "arithmetic mean of the PWV records flagged ok, met-interpolated or delay-sigma-unknown; pwv_sigma = mean of the records' sigma (errors taken as fully correlated within the interval); pwv_sd = sample standard deviation",
    },
  });
}
