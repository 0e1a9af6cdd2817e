/**
 * POST /v1/network-estimates benchmark (issue 12): what a caller pays for a 10-station network of
 * 30-s data with about 18 satellites in view (six planes of nine satellites, 7° cutoff), satellite
 * clocks estimated, gradients, screening k = 4, for one hour (JSON and CSV) and one day (CSV: about
 * 0.47 M observations, stations × observations ≈ 4.7 M of 5 M; as JSON the day is ~67 MB, above the
 * 64 MiB body limit).
 *
 * - HTTP: a real listening server (buildApp + listen on 127.0.0.1, one estimation worker), the JSON
 *   body sent with fetch; wall time from sending to the last byte of the answer.
 * - In-process: the route's worker task (handleNetworkRequest) called directly, i.e. the same parse,
 *   validation, estimation and serialisation without the HTTP hand-over and the thread.
 * One warm-up request of a few minutes of data through HTTP exercises every model first. Ranges over
 * the runs (min–max); the machine's load average is printed beside them.
 * `npm run bench -- network-route`; NETWORK_ROUTE_BENCH_QUICK=1 skips the day.
 */

import { loadavg } from 'node:os';
import { buildApp } from '../src/http/app.js';
import { handleNetworkRequest } from '../src/http/tasks/network-request.js';
import { simulateNetwork, stationAt, type SimStation } from '../test/estimation/network/network-simulator.js';

const RAD = 180 / Math.PI;
const C = [48.6, 15.2] as const;
const STATIONS: SimStation[] = Array.from({ length: 10 }, (_, i) =>
  stationAt(`BN${String(i).padStart(2, '0')}`, ...C, i === 0 ? 0 : 60 + 50 * (i % 4), (i * 137) % 360),
);

interface Request {
  bytes: Uint8Array;
  format: 'json' | 'csv';
  /** The stations and options as query parameters (text/csv). */
  query: Record<string, string | string[]>;
}

/** The request as compact JSON (values rounded as a client would send them) or as a CSV table. */
function request(hours: number, format: 'json' | 'csv'): Request {
  const s = simulateNetwork({
    seed: 5,
    stations: STATIONS,
    startIso: '2026-10-01T00:00:00Z',
    durationS: hours * 3600,
    samplingS: 30,
    minElevationDeg: 7,
    sigma0M: 0.003,
    satellitesPerPlane: 9,
    zwd: { intervalS: 300, randomWalkMPerSqrtH: 0.01, initialSigmaM: 0.03 },
    gradients: { intervalS: 21_600, randomWalkMPerSqrtH: 0.001, initialSigmaM: 0.0005 },
    commonOffsetM: 0,
    receiverClockAmplitudeM: 300_000,
    satelliteClockAmplitudeM: 300_000,
    grossErrors: Math.max(2, Math.round(hours)),
  });
  const o = s.observations;
  const round = (x: number, digits: number) => Number(x.toFixed(digits));
  const rows = o.epochMs.map((t, i) => ({
    station: o.station[i]!,
    epoch: new Date(t).toISOString(),
    satellite: o.satellite[i]!,
    elevation_deg: round(o.elevationRad[i]! * RAD, 6),
    azimuth_deg: round(o.azimuthRad[i]! * RAD, 6),
    residual_m: round(o.residualM[i]!, 5),
  }));
  const sites = s.stations.map((st) => ({
    id: st.name,
    site: { latitude_deg: round(st.latitudeRad * RAD, 6), longitude_deg: round(st.longitudeRad * RAD, 6), height_m: st.heightM },
    apriori: { zhd_m: 2.25, zwd_m: 0.1 },
  }));
  const options = { parametrisation: 'nodes', correlated_noise: false };
  if (format === 'json') {
    return { bytes: new TextEncoder().encode(JSON.stringify({ stations: sites, observations: rows, options })), format, query: {} };
  }
  const csv = ['station,epoch,satellite,elevation_deg,azimuth_deg,residual_m']
    .concat(rows.map((r) => `${r.station},${r.epoch},${r.satellite},${r.elevation_deg},${r.azimuth_deg},${r.residual_m}`))
    .join('\n');
  return {
    bytes: new TextEncoder().encode(csv),
    format,
    query: {
      station: sites.map((x) => `${x.id},${x.site.latitude_deg},${x.site.longitude_deg},${x.site.height_m},2.25,0.1`),
      ...options,
      correlated_noise: 'false',
    },
  };
}

const range = (xs: number[]) => `${(Math.min(...xs) / 1000).toFixed(1)}–${(Math.max(...xs) / 1000).toFixed(1)} s`;
const load = () => loadavg()[0]!.toFixed(1);

export default async function (): Promise<string[]> {
  const lines: string[] = [];
  const app = await buildApp({ config: { ESTIMATION_WORKERS: 1, REQUEST_TIMEOUT_MS: 600_000 } });
  await app.listen({ host: '127.0.0.1', port: 0 });
  const address = app.server.address();
  const url = `http://127.0.0.1:${typeof address === 'object' && address ? address.port : 0}/v1/network-estimates`;
  const post = async (r: Request) => {
    const query = new URLSearchParams();
    for (const [k, v] of Object.entries(r.query)) for (const x of Array.isArray(v) ? v : [v]) query.append(k, x);
    const started = performance.now();
    const res = await fetch(`${url}?${query}`, {
      method: 'POST',
      headers: { 'content-type': r.format === 'json' ? 'application/json' : 'text/csv' },
      body: r.bytes.slice(),
    });
    const text = await res.text();
    if (res.status !== 200) throw new Error(`${res.status}: ${text.slice(0, 300)}`);
    return { ms: performance.now() - started, answerBytes: text.length, answer: JSON.parse(text) };
  };
  try {
    await post(request(0.1, 'json')); // warm-up: every model, the worker thread
    await post(request(0.1, 'csv'));
    const cases: [string, number, 'json' | 'csv', number][] = [
      ['1 h', 1, 'json', 3],
      ['1 h', 1, 'csv', 3],
    ];
    if (process.env.NETWORK_ROUTE_BENCH_QUICK !== '1') cases.push(['24 h', 24, 'csv', 2]);
    for (const [label, hours, format, runs] of cases) {
      const req = request(hours, format);
      const bytes = req.bytes;
      const http: number[] = [];
      const inProcess: number[] = [];
      let answerBytes = 0;
      let observations = 0;
      let solutions = 0;
      const loads: string[] = [];
      for (let r = 0; r < runs; r++) {
        loads.push(load());
        const h = await post(req);
        http.push(h.ms);
        answerBytes = h.answerBytes;
        observations = h.answer.statistics.observations_total;
        solutions = h.answer.statistics.solutions;
        const started = performance.now();
        const text = new TextDecoder().decode(bytes);
        const out = await handleNetworkRequest({ body: format === 'json' ? bytes.slice() : text, format, query: req.query });
        inProcess.push(performance.now() - started);
        if (!out.ok) throw new Error(out.error.detail);
      }
      lines.push(
        `10 stations × ${label} at 30 s, ${format}: ${(observations / 1e3).toFixed(0)} k observations, body ${(bytes.length / 1e6).toFixed(1)} MB, answer ${(answerBytes / 1e6).toFixed(1)} MB, ${solutions} solutions; ` +
          `HTTP ${range(http)}, in-process task ${range(inProcess)} (${runs} runs; load average ${loads.join(', ')})`,
      );
    }
  } finally {
    await app.close();
  }
  return lines;
}
