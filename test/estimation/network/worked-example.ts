/**
 * The worked example of docs/network-estimation.md: `npx tsx test/estimation/network/worked-example.ts`
 * prints the figures quoted there (seeded simulation, invented stations and places).
 */

import { estimateNetwork } from '../../../src/estimation/network/estimate-network.js';
import { networkOptions, simulateNetwork, stationAt, toNetworkInput, truthZwd, type SimStation } from './network-simulator.js';

const C = [44.9, 12.3] as const;
const REGIONAL: SimStation[] = [
  stationAt('FENWICK', ...C, 0, 0),
  stationAt('GLASSFORD', ...C, 150, 20),
  stationAt('HARROWAY', ...C, 150, 110),
  stationAt('INGLEBY', ...C, 150, 200),
  stationAt('JESMOND', ...C, 150, 290),
];
const DISTANT: SimStation[] = [
  stationAt('KILBRIDE', ...C, 2100, 320),
  stationAt('LOWTHER', ...C, 3300, 200),
  stationAt('MARDALE', ...C, 4600, 95),
  stationAt('NORBURY', ...C, 5900, 250),
];

function run(
  label: string,
  stations: SimStation[],
  hours: number,
  samplingS: number,
  gradients: boolean,
  satelliteClocks: 'estimated' | 'known',
) {
  const sim = simulateNetwork({
    seed: 71,
    stations,
    startIso: '2026-08-12T09:00:00Z',
    durationS: hours * 3600,
    samplingS,
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
  const options = networkOptions({
    satelliteClocks,
    referenceStation: 'FENWICK',
    gradients: gradients ? networkOptions().gradients : null,
    scaleSigmas: true,
  });
  const out = estimateNetwork(toNetworkInput(sim, options));
  const mid = out.stations[0]!.epochs[Math.floor(out.stations[0]!.epochs.length / 2)]!.epochMs;
  const mm = (v: number) => (v * 1000).toFixed(1);
  console.log(`\n### ${label}`);
  console.log(
    `satellite clocks ${out.satelliteClocks}; extent ${out.commonMode.extentKm.toFixed(0)} km, ${out.commonMode.extentNadirDeg.toFixed(2)}° nadir; σ(network mean) ${out.commonMode.meanZwdSigmaClocksEstimatedM === null ? '—' : mm(out.commonMode.meanZwdSigmaClocksEstimatedM)} mm with clocks estimated, ${mm(out.commonMode.meanZwdSigmaClocksKnownM)} mm known; correlation with the clocks ${out.commonMode.correlationWithClocks?.toFixed(3) ?? '—'}; observations used ${out.statistics.observationsUsed}, single-station satellites ${out.statistics.singleStationSatellites}; variance factor ${out.statistics.varianceFactor?.toFixed(3)}`,
  );
  const ref = out.stations.findIndex((r) => r.station === 'FENWICK');
  const errRef = out.stations[ref]!.epochs.find((e) => e.epochMs === mid)!.correctionM - truthZwd(sim, ref, mid);
  console.log('| station | error at mid-session [mm] | σ absolute [mm] | error relative to FENWICK [mm] | σ relative [mm] |');
  console.log('|---|---|---|---|---|');
  out.stations.forEach((r, s) => {
    const e = r.epochs.find((x) => x.epochMs === mid)!;
    const err = e.correctionM - truthZwd(sim, s, mid);
    console.log(
      `| ${r.station} | ${mm(err)} | ${mm(e.sigmaM)} | ${s === ref ? '—' : mm(err - errRef)} | ${s === ref ? '—' : mm(e.relativeSigmaM)} |`,
    );
  });
  for (const w of out.warnings) console.log(`warning: ${w}`);
  return out;
}

const mode = process.argv[2] ?? 'cases';
if (mode === 'cases') {
  run('A: 300-km regional network alone, 1 h of 60-s data, gradients', REGIONAL, 1, 60, true, 'estimated');
  run('B: the same plus four stations 2 100–5 900 km away', [...REGIONAL, ...DISTANT], 1, 60, true, 'estimated');
  run('C: point positioning (satellite clocks known), regional network', REGIONAL, 1, 60, true, 'known');
} else {
  console.log('| session | gradients | σ(network mean), clocks estimated [mm] | clocks known [mm] | median σ relative [mm] |');
  console.log('|---|---|---|---|---|');
  for (const [hours, sampling] of [
    [1, 60],
    [6, 60],
    [24, 30],
  ] as const) {
    for (const g of [true, false]) {
      const sim = simulateNetwork({
        seed: 72,
        stations: REGIONAL,
        startIso: '2026-08-12T00:00:00Z',
        durationS: hours * 3600,
        samplingS: sampling,
        minElevationDeg: 3,
        sigma0M: 0.003,
        satellitesPerPlane: 5,
        zwd: { intervalS: 300, randomWalkMPerSqrtH: 0.01, initialSigmaM: 0.03 },
        gradients: { intervalS: 21_600, randomWalkMPerSqrtH: 0.001, initialSigmaM: 0.0005 },
        commonOffsetM: 0,
        receiverClockAmplitudeM: 300_000,
        satelliteClockAmplitudeM: 300_000,
        grossErrors: 0,
      });
      const out = estimateNetwork(
        toNetworkInput(sim, networkOptions({ outlierThreshold: null, gradients: g ? networkOptions().gradients : null })),
      );
      const rel = out.stations
        .filter((r) => r.station !== out.referenceStation)
        .map((r) => r.medianRelativeSigmaM)
        .sort((a, b) => a - b);
      console.log(
        `| ${hours} h at ${sampling} s | ${g ? 'on' : 'off'} | ${(out.commonMode.meanZwdSigmaClocksEstimatedM! * 1000).toFixed(1)} | ${(out.commonMode.meanZwdSigmaClocksKnownM * 1000).toFixed(2)} | ${(rel[Math.floor(rel.length / 2)]! * 1000).toFixed(2)} |`,
      );
    }
  }
}
