/**
 * A-priori delays: in-process slant delays per second on one core (Niell path, target ≥ 5 million/s),
 * and HTTP requests per second of a single-point POST /v1/zenith-delays against GET /v1/health in
 * the same run (autocannon, loopback, target ratio ≥ 0.6).
 */

import autocannon from 'autocannon';
import { DEG } from '../src/domain/constants.js';
import { GRADIENT_MODELS } from '../src/domain/gradients/gradient-mapping.js';
import { niellModel } from '../src/domain/mapping/niell.js';
import { allocateSlantBatch, computeSlantDelays } from '../src/domain/slant.js';
import { startServerProcess } from '../test/helpers/server-process.js';

function slantThroughput(): number {
  const n = 100_000;
  const elevations = new Float64Array(n);
  const azimuths = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    elevations[i] = (3 + (87 * i) / n) * DEG;
    azimuths[i] = ((i * 37) % 360) * DEG;
  }
  const mapping = niellModel.prepare({ latitudeRad: 47 * DEG, heightM: 400, dayOfYear: 172.3 });
  const gradient = GRADIENT_MODELS['chen-herring']!.prepare(mapping);
  const out = allocateSlantBatch(n);
  const zenith = { zhdM: 2.25, zwdM: 0.12, northGradientM: 0.0005, eastGradientM: -0.0003 };
  for (let w = 0; w < 20; w++) computeSlantDelays(mapping, gradient, zenith, elevations, azimuths, out);
  const rounds = 100;
  const t0 = performance.now();
  for (let r = 0; r < rounds; r++) computeSlantDelays(mapping, gradient, zenith, elevations, azimuths, out);
  const seconds = (performance.now() - t0) / 1000;
  return (rounds * n) / seconds;
}

async function requestsPerSecond(url: string, init: { method: 'GET' | 'POST'; body?: string }): Promise<number> {
  const result = await autocannon({
    url,
    method: init.method,
    body: init.body,
    headers: init.body ? { 'content-type': 'application/json' } : {},
    connections: 10,
    duration: 3,
  });
  if (result.non2xx > 0) throw new Error(`${url}: ${result.non2xx} non-2xx answers`);
  return result.requests.average;
}

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)]!;

/** Health and zenith-delays alternately, three times, against a service started with `env`. */
async function httpRatio(env: Record<string, string>) {
  const server = await startServerProcess(env, true);
  const body = JSON.stringify({
    site: { latitude_deg: 47.5, longitude_deg: 8.25, height_m: 420 },
    epoch: '2026-06-21T06:30:00Z',
    met: { pressure_hpa: 965.3, temperature_c: 18.2, relative_humidity_pct: 61 },
  });
  try {
    await requestsPerSecond(`${server.baseUrl}/v1/health`, { method: 'GET' }); // warm-up
    await requestsPerSecond(`${server.baseUrl}/v1/zenith-delays`, { method: 'POST', body });
    // Alternate the two routes so that a change in machine load affects both alike.
    const health: number[] = [];
    const zenith: number[] = [];
    const ratios: number[] = [];
    for (let round = 0; round < 3; round++) {
      health.push(await requestsPerSecond(`${server.baseUrl}/v1/health`, { method: 'GET' }));
      zenith.push(await requestsPerSecond(`${server.baseUrl}/v1/zenith-delays`, { method: 'POST', body }));
      ratios.push(zenith.at(-1)! / health.at(-1)!);
    }
    return { health: median(health), zenith: median(zenith), ratio: median(ratios) };
  } finally {
    await server.stop();
  }
}

export default async function bench(): Promise<string[]> {
  const perSecond = slantThroughput();
  // The service runs in its own process; autocannon loads it from this one (2 cores: one each).
  const logged = await httpRatio({ LOG_LEVEL: 'info' });
  const quiet = await httpRatio({ LOG_LEVEL: 'warn' });
  const line = (name: string, r: { health: number; zenith: number; ratio: number }) =>
    `${name}: GET /v1/health ${r.health.toFixed(0)} req/s, POST /v1/zenith-delays (single point) ${r.zenith.toFixed(0)} req/s, ratio ${r.ratio.toFixed(2)} (target ≥ 0.6)`;
  return [
    `slant delays in-process (Niell + Chen & Herring, one core): ${(perSecond / 1e6).toFixed(2)} million/s (target ≥ 5)`,
    line('HTTP, default configuration (LOG_LEVEL=info, one log line per request)', logged),
    line('HTTP, request logging off (LOG_LEVEL=warn)', quiet),
    '(medians of 3 alternating runs of 3 s, 10 connections, service in its own process)',
  ];
}
