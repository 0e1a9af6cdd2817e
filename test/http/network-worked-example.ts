/**
 * The worked example of docs/network-estimation.md ("Through HTTP"), run through POST
 * /v1/network-estimates on an in-process app: `npx tsx test/http/network-worked-example.ts` prints
 * the figures quoted there. Seeded simulation (test/estimation/network/network-simulator.ts, a known
 * truth), invented stations and places.
 */

import { buildApp } from '../../src/http/app.js';
import { simulateNetwork, stationAt, truthZwd, type NetworkSim, type SimStation } from '../estimation/network/network-simulator.js';

const RAD = 180 / Math.PI;
const C = [61.2, 24.8] as const;
const REGIONAL: SimStation[] = [
  stationAt('ASHCOMBE', ...C, 0, 0),
  stationAt('BRAMLEY', ...C, 150, 10),
  stationAt('CALDWELL', ...C, 150, 100),
  stationAt('DUNMORE', ...C, 150, 190),
  stationAt('ELMSTEAD', ...C, 150, 280),
];
const DISTANT: SimStation[] = [
  stationAt('FARNDALE', ...C, 2000, 200),
  stationAt('GRINDLEY', ...C, 3100, 250),
  stationAt('HOLBECK', ...C, 4500, 140),
  stationAt('IRESHAW', ...C, 6000, 230),
];
const APRIORI = { zhd_m: 2.28, zwd_m: 0.1 };

function simulate(stations: SimStation[], satelliteClocks: 'estimated' | 'known'): NetworkSim {
  return simulateNetwork({
    seed: 81,
    stations,
    startIso: '2026-09-03T10:00:00Z',
    durationS: 3600,
    samplingS: 60,
    minElevationDeg: 3,
    sigma0M: 0.003,
    satellitesPerPlane: 5,
    zwd: { intervalS: 300, randomWalkMPerSqrtH: 0.01, initialSigmaM: 0.03 },
    gradients: { intervalS: 21_600, randomWalkMPerSqrtH: 0.001, initialSigmaM: 0.0005 },
    commonOffsetM: 0.05,
    receiverClockAmplitudeM: 300_000,
    satelliteClockAmplitudeM: satelliteClocks === 'known' ? 0 : 300_000,
    grossErrors: 0,
  });
}

function body(s: NetworkSim, satelliteClocks: 'estimated' | 'known') {
  const o = s.observations;
  return {
    stations: s.stations.map((st) => ({
      id: st.name,
      site: { latitude_deg: st.latitudeRad * RAD, longitude_deg: st.longitudeRad * RAD, height_m: st.heightM },
      apriori: APRIORI,
    })),
    observations: o.epochMs.map((t, i) => ({
      station: o.station[i]!,
      epoch: new Date(t).toISOString(),
      satellite: o.satellite[i]!,
      elevation_deg: o.elevationRad[i]! * RAD,
      azimuth_deg: o.azimuthRad[i]! * RAD,
      residual_m: o.residualM[i]!,
    })),
    options: { parametrisation: 'nodes', correlated_noise: false, satellite_clocks: satelliteClocks, reference_station: 'ASHCOMBE' },
  };
}

const mm = (v: number | null) => (v === null ? '—' : (v * 1000).toFixed(1));

interface SeriesEntry {
  epoch: string;
  zwd_m: number;
  sigma_m: number;
  relative_sigma_m: number | null;
}

async function main() {
  const app = await buildApp({ logger: false });
  const cases: [string, SimStation[], 'estimated' | 'known'][] = [
    ['A: the 300-km network alone, clocks estimated', REGIONAL, 'estimated'],
    ['B: the same plus four stations 2 000-6 000 km away, clocks estimated', [...REGIONAL, ...DISTANT], 'estimated'],
    ['C: point positioning (satellite clocks known), the 300-km network', REGIONAL, 'known'],
  ];
  for (const [label, stations, clocks] of cases) {
    const s = simulate(stations, clocks);
    const res = await app.inject({ method: 'POST', url: '/v1/network-estimates', payload: body(s, clocks) });
    const b = res.json();
    if (res.statusCode !== 200) throw new Error(`${res.statusCode}: ${res.body}`);
    const cm = b.common_mode;
    console.log(`\n#### ${label}\n`);
    console.log(
      `${b.statistics.observations_total} observations, ${b.statistics.observations_used} used, ${b.statistics.single_station_satellites} single-station satellites; extent ${cm.extent_km.toFixed(0)} km, ${cm.extent_nadir_deg.toFixed(2)}° nadir; σ of the network mean ${mm(cm.mean_zwd_sigma_clocks_estimated_m)} mm with clocks estimated, ${mm(cm.mean_zwd_sigma_clocks_known_m)} mm known; correlation with the clocks ${cm.correlation_with_clocks?.toFixed(3) ?? '—'}; variance factor ${b.statistics.variance_factor?.toFixed(3)}`,
    );
    console.log('\n| station | ZWD error [mm] | sigma_m [mm] | error relative to ASHCOMBE [mm] | relative_sigma_m [mm] |');
    console.log('|---|---|---|---|---|');
    const ref = b.stations.find((x: { station: string }) => x.station === 'ASHCOMBE');
    const mid = ref.series[Math.floor(ref.series.length / 2)].epoch as string;
    const truth = (name: string) =>
      APRIORI.zwd_m +
      truthZwd(
        s,
        s.stations.findIndex((x) => x.name === name),
        Date.parse(mid),
      );
    const refEntry = ref.series.find((e: SeriesEntry) => e.epoch === mid) as SeriesEntry;
    for (const st of b.stations) {
      const e = st.series.find((x: SeriesEntry) => x.epoch === mid) as SeriesEntry;
      const err = e.zwd_m - truth(st.station);
      const rel = st.station === 'ASHCOMBE' ? null : err - (refEntry.zwd_m - truth('ASHCOMBE'));
      console.log(
        `| ${st.station} | ${mm(err)} | ${mm(e.sigma_m)} | ${mm(rel)} | ${st.station === 'ASHCOMBE' ? '—' : mm(e.relative_sigma_m)} |`,
      );
    }
    console.log(`\nwarnings (mid-session epoch ${mid}):`);
    for (const w of b.warnings) console.log(`    ${w}`);
  }
  await app.close();
}

await main();
