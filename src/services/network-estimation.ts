/**
 * The network ZWD estimation as a use case, in domain shapes (camelCase, SI; observation angles in
 * radians): request → size checks before any work → a-priori delays per station → estimateNetwork
 * (src/estimation/network) → models, fingerprint and warnings. Free of HTTP: the adapters in
 * src/http turn API bodies into NetworkEstimationRequest and the result into the API answer; the
 * storing route stores networkDelayColumns(result, s) for every station.
 *
 * The options are the single-station estimator's (the one table, src/services/zwd-options.ts) plus
 * the network's own: how the satellite clocks are treated, the reference station of the relative
 * ZWD, and the threshold of the common-mode warning.
 *
 * Surface met is given per station (records with a `station`, like the observations): each station's
 * series gets ZHD, ZWD, Tm and PWV per epoch by the single-station rule (seriesZwd of
 * zwd-estimation.ts: the pressure bridged across met gaps, `zhdSource` met | met-bridged | apriori),
 * so a station's series and its stored form are those of the single-station estimation with the same met.
 */

import { DEG } from '../domain/constants.js';
import { MODEL_NAMES, provenance, type ModelSet } from '../domain/provenance.js';
import type { Site } from '../domain/site.js';
import { ModelDomainError } from '../domain/errors.js';
import { siteHeights } from '../domain/geometry/geoid.js';
import { standardAtmosphere } from '../domain/meteo/standard-atmosphere.js';
import { zenithHydrostaticDelayM } from '../domain/zenith/hydrostatic.js';
import { estimateNetwork } from '../estimation/network/estimate-network.js';
import type {
  NetworkEstimationOutput,
  NetworkObservationColumns,
  NetworkParametrisation,
  SatelliteClockHandling,
} from '../estimation/network/types.js';
import { MAX_ANSWER_NODES, MAX_MET_RECORDS, MAX_NETWORK_STATION_OBSERVATIONS } from '../limits.js';
import { answerSize } from './answer-size.js';
import { CallerError } from './caller-error.js';
import type { MetColumns } from './station-met.js';
import { guardResidualUnit, relativeHumidityUnitWarning } from './unit-guards.js';
import { warning, type Warning } from './warnings.js';
import { delayColumnsOfEpochs, seriesZwd, toEstimatorOptions, zwdModels, type DelayColumns, type SeriesZwd } from './zwd-estimation.js';
import type { ZwdOptionValues } from './zwd-options.js';

export const SATELLITE_CLOCK_HANDLING = ['estimated', 'known'] as const satisfies readonly SatelliteClockHandling[];

/** Default threshold of the common-mode warning: σ of the network-mean ZWD above 5 mm (≈ 0.8 mm of PWV) [m]. */
export const DEFAULT_COMMON_MODE_SIGMA_THRESHOLD_M = 0.005;

export interface NetworkStationRequest {
  /** Station id; observations refer to it. */
  name: string;
  site: Site;
  /** The a-priori zenith delays this station's residuals were formed with [m]; absent ZHD = standard atmosphere, absent ZWD = 0. */
  apriori: { zhdM?: number | undefined; zwdM?: number | undefined };
}

/** Surface met of the stations at their site heights, in any order: the single-station columns plus the station of each record. */
export interface NetworkMetColumns extends MetColumns {
  station: string[];
}

export interface NetworkEstimationRequest {
  stations: NetworkStationRequest[];
  observations: NetworkObservationColumns;
  /** Met of any of the stations (a station without records gets its ZHD from the a-priori, as without met). */
  met?: NetworkMetColumns | undefined;
  /** Relative humidities of the met records as sent [%] (not needed for PWV; checked for their unit only). */
  metRelativeHumidityPct?: (number | null)[] | undefined;
  options: ZwdOptionValues;
  satelliteClocks: SatelliteClockHandling;
  /** Station of the relative ZWD; null = the station nearest the network's centroid. */
  referenceStation: string | null;
  /** The absolute-level warning is given when σ of the network-mean ZWD exceeds this [m]. */
  commonModeSigmaThresholdM: number;
  /** Largest stations × observations; absent = a request body's (MAX_NETWORK_STATION_OBSERVATIONS). */
  sizeLimit?: NetworkSizeLimit | undefined;
}

/** The size limit of one network estimation and how its 413 reads (field, limit's name, what to do instead). */
export interface NetworkSizeLimit {
  stationObservations: number;
  field: string;
  name: string;
  advice: string;
}

/** The limit of a request that carries its observations in the body. */
export const BODY_SIZE_LIMIT: NetworkSizeLimit = {
  stationObservations: MAX_NETWORK_STATION_OBSERVATIONS,
  field: 'observations',
  name: 'MAX_NETWORK_STATION_OBSERVATIONS',
  advice:
    'Larger networks and longer days go through the archive: deposit each station-day (PUT /v1/stations/{id}/residuals/{day}) and estimate the day with POST /v1/network/days/{day}/zwd-estimates',
};

export interface StationApriori {
  zhdM: number;
  zwdM: number;
  zhdSource: 'caller' | 'standard-atmosphere';
}

export interface NetworkEstimationResult {
  output: NetworkEstimationOutput;
  /** One per output.stations entry (the request's station order). */
  apriori: StationApriori[];
  /** One per output.stations entry: ZHD, ZWD and, with met, Tm and PWV per epoch (seriesZwd). */
  series: SeriesZwd[];
  models: ModelSet;
  modelFingerprint: string;
  warnings: Warning[];
}

/**
 * @throws CallerError 413 when stations × observations exceed MAX_NETWORK_STATION_OBSERVATIONS,
 *   422 when the answer would hold more than MAX_ANSWER_NODES output nodes (both before any work)
 */
export function checkNetworkSize(request: Pick<NetworkEstimationRequest, 'stations' | 'observations' | 'options' | 'sizeLimit'>): void {
  const stations = request.stations.length;
  const observations = request.observations.epochMs.length;
  const limit = request.sizeLimit ?? BODY_SIZE_LIMIT;
  if (stations * observations > limit.stationObservations) {
    const fit = Math.floor(limit.stationObservations / Math.max(stations, 1));
    throw CallerError.field(
      413,
      limit.field,
      `${stations} stations × ${observations} observations = ${stations * observations}; one request takes at most ${limit.stationObservations} (stations × observations, ${limit.name}): ask for less, e.g. at most ${fit} observations with these ${stations} stations (a shorter span or a longer sampling interval) or fewer stations. ${limit.advice}`,
    );
  }
  const { zwdNodes, gradientNodes } = answerSize(request.observations.epochMs, request.options);
  const perStation = zwdNodes + gradientNodes;
  if (stations * perStation > MAX_ANSWER_NODES) {
    const field = gradientNodes > zwdNodes ? 'options.gradients.interval_s' : 'options.zwd_interval_s';
    const message = `the answer would hold ${stations * perStation} output nodes (${stations} stations × (${zwdNodes} ZWD at ${request.options.zwdIntervalS} s + ${gradientNodes} gradient nodes)); at most ${MAX_ANSWER_NODES} (MAX_ANSWER_NODES): ask for less, a larger ${field.replace('options.', '')}, fewer stations or a shorter span`;
    throw new CallerError(422, `${field}: ${message}`, [{ field, message }]);
  }
}

/**
 * The a-priori delays of a station; the default ZHD as the single-station route's: Saastamoinen with
 * the standard atmosphere at the height above sea level (EGM96).
 */
function aprioriOf(station: NetworkStationRequest): StationApriori {
  const { site, apriori } = station;
  const zhdSource = apriori.zhdM === undefined ? ('standard-atmosphere' as const) : ('caller' as const);
  const aboveSeaLevelM = siteHeights(site.latitudeDeg, site.longitudeDeg, site.heightM).aboveSeaLevelM;
  const zhdM =
    apriori.zhdM ?? zenithHydrostaticDelayM(standardAtmosphere(aboveSeaLevelM).pressureHpa, site.latitudeDeg * DEG, site.heightM);
  return { zhdM, zwdM: apriori.zwdM ?? 0, zhdSource };
}

const iso = (ms: number) => new Date(ms).toISOString();

/**
 * The met records split by station (request order kept within a station).
 * @throws CallerError 400 naming `met` past MAX_MET_RECORDS records; `met.<i>.station` for a station not
 *   in `stations`; `met.<i>` for a station's repeated epoch (naming the other record too)
 */
export function metByStation(met: NetworkMetColumns | undefined, stations: readonly string[]): Map<string, MetColumns> {
  const out = new Map<string, MetColumns>();
  if (!met) return out;
  if (met.epochMs.length > MAX_MET_RECORDS) {
    throw CallerError.field(
      400,
      'met',
      `${met.epochMs.length} records; a network request takes at most ${MAX_MET_RECORDS} (all stations together)`,
    );
  }
  const known = new Set(stations);
  const seen = new Map<string, number>();
  for (let i = 0; i < met.epochMs.length; i++) {
    const station = met.station[i]!;
    if (!known.has(station)) {
      throw CallerError.field(
        400,
        `met.${i}.station`,
        `${station} is not in stations (${stations.slice(0, 10).join(', ')}${stations.length > 10 ? ', …' : ''}); met records name one of stations[].id`,
      );
    }
    const key = `${station}\u0000${met.epochMs[i]}`;
    const other = seen.get(key);
    if (other !== undefined) {
      throw new ModelDomainError(
        `met.${i}`,
        `duplicate met epoch ${iso(met.epochMs[i]!)} of station ${station}: also met.${other}; each epoch may appear once per station`,
        400,
      );
    }
    seen.set(key, i);
    let columns = out.get(station);
    if (!columns) out.set(station, (columns = { epochMs: [], pressureHpa: [], temperatureC: [] }));
    columns.epochMs.push(met.epochMs[i]!);
    columns.pressureHpa.push(met.pressureHpa[i]!);
    columns.temperatureC.push(met.temperatureC[i]!);
  }
  return out;
}

/** Models of a network result: the single-station settings, the network estimator and how the clocks were treated. */
export function networkModels(
  options: ZwdOptionValues,
  satelliteClocks: SatelliteClockHandling,
  zhdSources: readonly StationApriori['zhdSource'][],
  parametrisation: NetworkParametrisation | null = null,
): ModelSet {
  const allCaller = zhdSources.every((s) => s === 'caller');
  const noneCaller = zhdSources.every((s) => s === 'standard-atmosphere');
  const standard = `${MODEL_NAMES.zhd} with ${MODEL_NAMES.standardAtmosphere}`;
  return {
    ...zwdModels(options, allCaller ? 'caller' : 'standard-atmosphere'),
    estimator:
      satelliteClocks === 'estimated'
        ? `network least squares: ${parametrisation?.statement ?? 'piecewise-linear nodes on round UTC epochs, random-walk constraints'}, receiver and satellite clocks per epoch pre-eliminated (one datum clock per connected group of stations and epoch), outlier screening across the network`
        : 'network least squares with satellite clocks known: independent single-station solutions, piecewise-linear nodes on round UTC epochs, random-walk constraints, receiver clocks per epoch pre-eliminated',
    apriori_zhd: allCaller ? 'caller' : noneCaller ? standard : `caller where given, else ${standard}`,
    satellite_clocks: satelliteClocks,
  };
}

/**
 * @throws CallerError 413/422 (checkNetworkSize), 400 (residuals in millimetres, point-positioning
 *   case only); ModelDomainError 400/422 from the estimator (unknown or duplicate station, a node
 *   not determined)
 */
export function runNetworkEstimation(request: NetworkEstimationRequest): NetworkEstimationResult {
  checkNetworkSize(request);
  const metOf = metByStation(
    request.met,
    request.stations.map((s) => s.name),
  );
  const obs = request.observations;
  if (request.satelliteClocks === 'known') {
    // With satellite clocks estimated the residuals of an epoch hold a clock per satellite (up to
    // hundreds of km apart), so the unit guard only applies with the clocks known, per station.
    const byStation = new Map<string, number[]>();
    obs.station.forEach((s, i) => {
      const list = byStation.get(s);
      if (list) list.push(i);
      else byStation.set(s, [i]);
    });
    for (const idx of byStation.values())
      guardResidualUnit(
        idx.map((i) => obs.epochMs[i]!),
        idx.map((i) => obs.residualM[i]!),
      );
  }
  const output = estimateNetwork({
    stations: request.stations.map((s) => ({
      name: s.name,
      latitudeRad: s.site.latitudeDeg * DEG,
      longitudeRad: s.site.longitudeDeg * DEG,
      heightM: s.site.heightM,
    })),
    observations: obs,
    options: {
      ...toEstimatorOptions(request.options),
      satelliteClocks: request.satelliteClocks,
      referenceStation: request.referenceStation,
      // The absolute-level warning is made here, with its own code.
      commonModeSigmaThresholdM: Number.POSITIVE_INFINITY,
    },
  });
  const byName = new Map(request.stations.map((s) => [s.name, s]));
  const apriori = output.stations.map((r) => aprioriOf(byName.get(r.station)!));
  const warnings: Warning[] = output.warnings.map((text) => warning('estimator', text));
  if (request.metRelativeHumidityPct) {
    const rh = relativeHumidityUnitWarning('met.relative_humidity_pct', request.metRelativeHumidityPct);
    if (rh) warnings.push(rh);
  }
  const series = output.stations.map((r, s) => {
    const station = byName.get(r.station)!;
    const a = apriori[s]!;
    const ztdM = (k: number) => a.zhdM + a.zwdM + r.epochs[k]!.correctionM;
    const result = seriesZwd(station.site, metOf.get(r.station), request.options.metMaxGapS, r.epochs, ztdM, a.zhdM);
    // The single-station warnings, each naming its station.
    warnings.push(...result.warnings.map((w) => warning(w.code, `station ${r.station}: ${w.text}`)));
    return result;
  });
  const defaulted = output.stations.filter((_, s) => apriori[s]!.zhdSource === 'standard-atmosphere').map((r) => r.station);
  if (defaulted.length > 0) {
    warnings.push(
      warning(
        'apriori-zhd-defaulted',
        `stations.apriori.zhd_m not given for ${defaulted.length} station${defaulted.length > 1 ? 's' : ''} (${defaulted.slice(0, 10).join(', ')}${defaulted.length > 10 ? ', …' : ''}): the Saastamoinen ZHD of the standard atmosphere at the station height is used for ztd_m; give the ZHD the residuals were formed with`,
      ),
    );
  }
  const cm = output.commonMode;
  const sigmaMean = cm.meanZwdSigmaClocksEstimatedM;
  if (sigmaMean !== null && sigmaMean > request.commonModeSigmaThresholdM) {
    warnings.push(
      warning(
        'absolute-level-poorly-determined',
        `the absolute ZWD level is poorly determined: σ of the network-mean ZWD is ${(sigmaMean * 1000).toFixed(1)} mm (threshold ${(request.commonModeSigmaThresholdM * 1000).toFixed(1)} mm, options.common_mode_sigma_threshold_m; ${(cm.meanZwdSigmaClocksKnownM * 1000).toFixed(1)} mm with satellite clocks known). The network spans ${cm.extentKm.toFixed(0)} km, ${cm.extentNadirDeg.toFixed(2)}° of nadir angle seen from the satellites: only ZWD differences between stations (relative_sigma_m) are well determined; add distant stations, a longer session, or use satellite clocks of a global solution (satellite_clocks "known")`,
      ),
    );
  }
  const { models, model_fingerprint } = provenance(
    networkModels(
      request.options,
      output.satelliteClocks,
      apriori.map((a) => a.zhdSource),
      output.parametrisation,
    ),
  );
  return { output, apriori, series, models, modelFingerprint: model_fingerprint, warnings };
}

/** The stored form of station `s` of a result, as delayColumns of zwd-estimation.ts (ZWD of the one definition, with its met). */
export function networkDelayColumns(result: NetworkEstimationResult, s: number): DelayColumns {
  const epochs = result.output.stations[s]!.epochs;
  const a = result.apriori[s]!;
  const zwd = result.series[s]!.epochZwd;
  return delayColumnsOfEpochs(epochs, a.zhdM + a.zwdM, (k) => zwd[k]!.zwdM);
}
