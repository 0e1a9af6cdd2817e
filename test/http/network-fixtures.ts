/**
 * The invented network of the route tests (test/http/network-*.test.ts): the independent simulator
 * (test/estimation/network/network-simulator.ts, shares no code with src/) run on four stations of a
 * 300-km network, and the request bodies made from its output. Stations and places are invented.
 */

import { tableFromArrays, tableToIPC, type Table } from 'apache-arrow';
import { expect } from 'vitest';
import type { ArchiveApp } from '../helpers/archive-app.js';
import { simulateNetwork, stationAt, type NetworkSim, type SimStation } from '../estimation/network/network-simulator.js';

export const MM = 1e-3;
/** Same arithmetic up to rounding (issue 12: "to 1e-9 m"). */
export const TOL_M = 1e-9;
export const RAD = 180 / Math.PI;

export const CENTRE = [51.3, -2.4] as const;
export const REGIONAL: SimStation[] = [
  stationAt('OAKHURST', ...CENTRE, 0, 0),
  stationAt('PENNAWAY', ...CENTRE, 140, 30),
  stationAt('QUARLEY', ...CENTRE, 150, 150),
  stationAt('RIVELIN', ...CENTRE, 130, 260),
];

export function sim(seed: number, satelliteClocks: 'estimated' | 'known', stations = REGIONAL, commonOffsetM = 0): NetworkSim {
  return simulateNetwork({
    seed,
    stations,
    startIso: '2026-06-21T06:00:00Z',
    durationS: 3600,
    samplingS: 60,
    minElevationDeg: 3,
    sigma0M: 0.003,
    satellitesPerPlane: 5,
    zwd: { intervalS: 300, randomWalkMPerSqrtH: 0.01, initialSigmaM: 0.03 },
    gradients: { intervalS: 21_600, randomWalkMPerSqrtH: 0.001, initialSigmaM: 0.0005 },
    commonOffsetM,
    receiverClockAmplitudeM: 300_000,
    satelliteClockAmplitudeM: satelliteClocks === 'known' ? 0 : 300_000,
    grossErrors: 2,
  });
}

export const APRIORI = { zhd_m: 2.25, zwd_m: 0.12 };
/** The options in which the network estimator and the single-station route share one model (docs/network-estimation.md). */
export const SHARED_MODEL = { parametrisation: 'nodes', correlated_noise: false, scale_sigmas: false, zwd_interval_s: 300 };

export const siteOf = (s: NetworkSim['stations'][number]) => ({
  latitude_deg: s.latitudeRad * RAD,
  longitude_deg: s.longitudeRad * RAD,
  height_m: s.heightM,
});

export function observationsOf(s: NetworkSim, only?: string) {
  const o = s.observations;
  const out = [];
  for (let i = 0; i < o.epochMs.length; i++) {
    if (only !== undefined && o.station[i] !== only) continue;
    out.push({
      ...(only === undefined ? { station: o.station[i]! } : {}),
      epoch: new Date(o.epochMs[i]!).toISOString(),
      satellite: o.satellite[i]!,
      elevation_deg: o.elevationRad[i]! * RAD,
      azimuth_deg: o.azimuthRad[i]! * RAD,
      residual_m: o.residualM[i]!,
    });
  }
  return out;
}

export function networkBody(s: NetworkSim, options: Record<string, unknown>) {
  return {
    stations: s.stations.map((st) => ({ id: st.name, site: siteOf(st), apriori: APRIORI })),
    observations: observationsOf(s),
    options,
  };
}

export function csvOf(observations: ReturnType<typeof observationsOf>): string {
  const header = 'station,epoch,satellite,elevation_deg,azimuth_deg,residual_m';
  return [
    header,
    ...observations.map((o) => [o.station, o.epoch, o.satellite, o.elevation_deg, o.azimuth_deg, o.residual_m].join(',')),
  ].join('\n');
}

/** An observation of a request body in its object form (with a station for the network routes). */
interface ObservationRow {
  station?: string;
  epoch: string;
  satellite: string;
  elevation_deg: number;
  azimuth_deg: number;
  residual_m: number;
}

/**
 * The observations as an Arrow IPC stream (station, when the rows have one, and epoch as text, the numbers as
 * float64), `rest` in the metadata.
 */
export function arrowBody(rows: readonly ObservationRow[], rest: Record<string, unknown>): Buffer {
  const table = tableFromArrays({
    ...(rows[0]?.station !== undefined ? { station: rows.map((r) => r.station!) } : {}),
    epoch: rows.map((r) => r.epoch),
    satellite: rows.map((r) => r.satellite),
    elevation_deg: Float64Array.from(rows, (r) => r.elevation_deg),
    azimuth_deg: Float64Array.from(rows, (r) => r.azimuth_deg),
    residual_m: Float64Array.from(rows, (r) => r.residual_m),
  }) as Table;
  table.schema.metadata.set('request', JSON.stringify(rest));
  return Buffer.from(tableToIPC(table, 'stream'));
}

/** Puts every station of the simulation into the archive (created, or already there), each at its site. */
export async function putStations(api: ArchiveApp['api'], auth: string, s: NetworkSim): Promise<void> {
  for (const st of s.stations) {
    await api()
      .put(`/v1/stations/${st.name}`)
      .set('authorization', auth)
      .send({ name: `${st.name} (invented)`, ...siteOf(st) })
      .expect((r) => expect([200, 201]).toContain(r.status));
  }
}
