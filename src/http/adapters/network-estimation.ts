/**
 * Adapters of the network estimation between the API shape (snake_case, unit suffixes, degrees,
 * ISO epochs) and the domain shape of src/services/network-estimation.ts (camelCase, SI, radians, ms).
 * A station's answer reuses the single-station answer's parts (same field names and meanings).
 */

import type { Site } from '../../domain/site.js';
import type { NetworkObservationColumns } from '../../estimation/network/types.js';
import type { NetworkEstimationRequest, NetworkEstimationResult } from '../../services/network-estimation.js';
import { CallerError } from '../../services/caller-error.js';
import { warningTexts } from '../../services/warnings.js';
import type { NetworkEstimatesRequest, NetworkEstimatesResponse, NetworkOptionsBody } from '../schemas/network-estimates.js';
import type { ZwdEstimationBody } from '../schemas/zwd-estimates.js';
import { observationsFromColumns, observationsFromObjects, seriesEntryOf, toOptionValues } from './zwd-estimation.js';

const iso = (ms: number) => new Date(ms).toISOString();
const finiteOrNull = (x: number | null) => (x === null || !Number.isFinite(x) ? null : x);

/** A station of the validated body: its id, site (from the body or the archive) and a-priori delays. */
export interface NetworkStationBody {
  id: string;
  site: Site;
  apriori?: { zhd_m?: number | undefined; zwd_m?: number | undefined } | undefined;
}

/** Observations as objects (validated) → domain columns: the single-station adapter's plus the station of each. */
export function networkObservationsFromObjects(list: NetworkEstimatesRequest['observations']): NetworkObservationColumns {
  return { station: list.map((o) => o.station), ...observationsFromObjects(list) };
}

/** Observations as column arrays (checked by src/http/columns.ts) → domain columns. */
export function networkObservationsFromColumns(c: Record<string, unknown[] | undefined>): NetworkObservationColumns {
  return { station: c.station as string[], ...observationsFromColumns(c) };
}

/** The validated body and its observations in domain columns → the domain request. @throws CallerError 400 for a repeated station id */
export function toNetworkRequest(
  stations: NetworkStationBody[],
  body: Pick<NetworkEstimatesRequest, 'met'> & { options: NetworkOptionsBody },
  observations: NetworkObservationColumns,
): NetworkEstimationRequest {
  const seen = new Map<string, number>();
  stations.forEach((s, i) => {
    const other = seen.get(s.id);
    if (other !== undefined)
      throw CallerError.field(400, `stations.${i}.id`, `station ${s.id} is also stations.${other}; ids must be unique`);
    seen.set(s.id, i);
  });
  const { satellite_clocks, reference_station, common_mode_sigma_threshold_m, ...single } = body.options;
  const met = body.met;
  return {
    stations: stations.map((s) => ({ name: s.id, site: s.site, apriori: { zhdM: s.apriori?.zhd_m, zwdM: s.apriori?.zwd_m } })),
    observations,
    met: met && {
      station: met.map((r) => r.station),
      epochMs: met.map((r) => Date.parse(r.epoch)),
      pressureHpa: met.map((r) => r.pressure_hpa),
      temperatureC: met.map((r) => r.temperature_c),
    },
    metRelativeHumidityPct: met?.map((r) => r.relative_humidity_pct ?? null),
    options: toOptionValues(single as ZwdEstimationBody['options']),
    satelliteClocks: satellite_clocks,
    referenceStation: reference_station,
    commonModeSigmaThresholdM: common_mode_sigma_threshold_m,
  };
}

/** The domain result → the API answer of POST /v1/network-estimates. */
export function networkEstimatesResponseOf(r: NetworkEstimationResult, extraWarnings: readonly string[] = []): NetworkEstimatesResponse {
  const { output } = r;
  const s = output.statistics;
  const cm = output.commonMode;
  return {
    reference_station: output.referenceStation,
    satellite_clocks: output.satelliteClocks,
    stations: output.stations.map((st, k) => {
      const a = r.apriori[k]!;
      const ztd0 = a.zhdM + a.zwdM;
      return {
        station: st.station,
        zwd_nodes: st.zwdNodes.map((n) => ({
          epoch: iso(n.epochMs),
          correction_m: n.correctionM,
          zwd_m: a.zwdM + n.correctionM,
          sigma_m: n.sigmaM,
          observations_nearby: n.observationsNearby,
          relative_sigma_m: finiteOrNull(n.relativeSigmaM),
        })),
        gradient_nodes: st.gradientNodes.map((g) => ({
          epoch: iso(g.epochMs),
          north_m: g.northM,
          east_m: g.eastM,
          north_sigma_m: g.northSigmaM,
          east_sigma_m: g.eastSigmaM,
          observations_nearby: g.observationsNearby,
        })),
        series: st.epochs.map((e, j) => ({
          ...seriesEntryOf(e, r.series[k]!.epochZwd[j]!, r.series[k]!.epochMet?.[j], ztd0),
          relative_sigma_m: finiteOrNull(e.relativeSigmaM),
        })),
        rejected: st.rejected.map((x) => ({
          index: x.index,
          epoch: iso(x.epochMs),
          satellite: x.satellite,
          residual_m: x.residualM,
          fitted_residual_m: x.fittedResidualM,
          normalized_residual: x.normalizedResidual,
        })),
        statistics: {
          observations_total: st.statistics.observationsTotal,
          observations_below_cutoff: st.statistics.observationsBelowCutoff,
          observations_single_station_satellite: st.statistics.observationsSingleStationSatellite,
          observations_used: st.statistics.observationsUsed,
          observations_rejected: st.statistics.observationsRejected,
          epochs: st.statistics.epochs,
        },
        sigma_m: finiteOrNull(st.medianSigmaM),
        relative_sigma_m: finiteOrNull(st.medianRelativeSigmaM),
        apriori: { zhd_m: a.zhdM, zwd_m: a.zwdM, zhd_source: a.zhdSource },
      };
    }),
    common_mode: {
      mean_zwd_sigma_clocks_estimated_m: finiteOrNull(cm.meanZwdSigmaClocksEstimatedM),
      mean_zwd_sigma_clocks_known_m: finiteOrNull(cm.meanZwdSigmaClocksKnownM),
      correlation_with_clocks: finiteOrNull(cm.correlationWithClocks),
      extent_km: cm.extentKm,
      extent_nadir_deg: cm.extentNadirDeg,
    },
    statistics: {
      stations: s.stations,
      epochs: s.epochs,
      observations_total: s.observationsTotal,
      observations_used: s.observationsUsed,
      observations_rejected: s.observationsRejected,
      observations_single_station_satellite: s.observationsSingleStationSatellite,
      single_station_satellites: s.singleStationSatellites,
      single_station_epochs: s.singleStationEpochs,
      unknowns: s.unknowns,
      clock_unknowns: s.clockUnknowns,
      constraints: s.constraints,
      degrees_of_freedom: s.degreesOfFreedom,
      rms_m: finiteOrNull(s.rmsM),
      variance_factor: finiteOrNull(s.varianceFactor),
      sigma_scale: finiteOrNull(s.sigmaScale),
      solutions: s.solutions,
      screening_complete: s.screeningComplete,
    },
    models: r.models,
    model_fingerprint: r.modelFingerprint,
    warnings: [...warningTexts(r.warnings), ...extraWarnings],
  };
}
