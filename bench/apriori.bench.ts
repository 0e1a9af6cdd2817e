/**
 * A-priori delays: in-process slant delays per second on one core (Niell path, target ≥ 5 million/s;
 * after every mapping model has run ≥ 0.8 × a hand-written kernel),
 * and HTTP requests per second of a single-point POST /v1/zenith-delays against GET /v1/health in
 * the same run (autocannon, loopback, target ratio ≥ 0.6).
 */

import autocannon from 'autocannon';
import { DEG } from '../src/domain/constants.js';
import { CHEN_HERRING_C, GRADIENT_MODELS } from '../src/domain/gradients/gradient-mapping.js';
import { MAPPING_MODELS } from '../src/domain/mapping/registry.js';
import { NIELL_HEIGHT_CORRECTION, niellHydrostaticCoefficients, niellWetCoefficients } from '../src/domain/mapping/niell.js';
import type { MappingContext } from '../src/domain/mapping/types.js';
import { allocateSlantBatch, computeSlantDelays, type SlantBatch } from '../src/domain/slant.js';
import { startServerProcess } from '../test/helpers/server-process.js';

const N = 100_000;
const ELEVATIONS = Float64Array.from({ length: N }, (_, i) => (3 + (87 * i) / N) * DEG);
const AZIMUTHS = Float64Array.from({ length: N }, (_, i) => ((i * 37) % 360) * DEG);
const CONTEXT: MappingContext = {
  latitudeRad: 47 * DEG,
  heightM: 400,
  dayOfYear: 172.3,
  coefficients: { ah: 0.00121, aw: 0.00055, heightReference: 'site' },
};
const ZENITH = { zhdM: 2.25, zwdM: 0.12, northGradientM: 0.0005, eastGradientM: -0.0003 };

/**
 * The yardstick: Niell + Chen & Herring slant delays written out in one loop with the coefficients
 * as local numbers, no model objects, no calls but Math's (what a careful hand-written kernel costs).
 */
function handWrittenNiellKernel(out: SlantBatch): void {
  const h = niellHydrostaticCoefficients(CONTEXT.latitudeRad, CONTEXT.dayOfYear);
  const w = niellWetCoefficients(CONTEXT.latitudeRad);
  const hc = NIELL_HEIGHT_CORRECTION;
  const heightKm = CONTEXT.heightM / 1000;
  const topH = 1 + h.a / (1 + h.b / (1 + h.c));
  const topW = 1 + w.a / (1 + w.b / (1 + w.c));
  const topC = 1 + hc.a / (1 + hc.b / (1 + hc.c));
  const { zhdM, zwdM, northGradientM: gn, eastGradientM: ge } = ZENITH;
  for (let i = 0; i < N; i++) {
    const e = ELEVATIONS[i]!;
    const a = AZIMUTHS[i]!;
    const s = Math.sin(e);
    const mh = topH / (s + h.a / (s + h.b / (s + h.c))) + (1 / s - topC / (s + hc.a / (s + hc.b / (s + hc.c)))) * heightKm;
    const mw = topW / (s + w.a / (s + w.b / (s + w.c)));
    const mg = 1 / (s * Math.tan(e) + CHEN_HERRING_C);
    const hyd = mh * zhdM;
    const wet = mw * zwdM;
    const grad = mg * (gn * Math.cos(a) + ge * Math.sin(a));
    out.mappingHydrostatic[i] = mh;
    out.mappingWet[i] = mw;
    out.mappingGradient[i] = mg;
    out.hydrostaticM[i] = hyd;
    out.wetM[i] = wet;
    out.gradientM[i] = grad;
    out.totalM[i] = hyd + wet + grad;
  }
}

/** Directions per second of `run` over the N directions: 10 warm-up rounds, then the best of 5 × 20 rounds. */
function perSecond(run: () => void): number {
  for (let w = 0; w < 10; w++) run();
  let best = 0;
  for (let trial = 0; trial < 5; trial++) {
    const t0 = performance.now();
    for (let r = 0; r < 20; r++) run();
    best = Math.max(best, (20 * N) / ((performance.now() - t0) / 1000));
  }
  return best;
}

const serviceSlants = (model: keyof typeof MAPPING_MODELS, gradient: string, out: SlantBatch) => () =>
  computeSlantDelays(MAPPING_MODELS[model].prepare(CONTEXT), GRADIENT_MODELS[gradient]!, ZENITH, ELEVATIONS, AZIMUTHS, out);

/**
 * Slant delays in-process: the hand-written kernel, the service's path with Niell before any other model
 * has run, then every mapping × gradient model, then Niell again (a call site that has met several
 * models must not be slower: the target is ≥ 0.8 × the kernel after all models have run).
 */
function slantThroughput() {
  const out = allocateSlantBatch(N);
  const kernel = perSecond(() => handWrittenNiellKernel(out));
  const niellFirst = perSecond(serviceSlants('niell', 'chen-herring', out));
  const others: string[] = [];
  for (const model of Object.keys(MAPPING_MODELS) as (keyof typeof MAPPING_MODELS)[]) {
    for (const gradient of Object.keys(GRADIENT_MODELS)) {
      others.push(`${model}+${gradient} ${(perSecond(serviceSlants(model, gradient, out)) / 1e6).toFixed(1)}`);
    }
  }
  // Both sides get the best of two measurements, one before and one after the kernel's second (the kernel
  // used to get two and the service one, a tilt against the service on a noisy machine); a process in which
  // the service's path is slow after the other models stays slow in both.
  const niellAfter = perSecond(serviceSlants('niell', 'chen-herring', out));
  const kernelAfter = perSecond(() => handWrittenNiellKernel(out));
  const niellAfterAgain = perSecond(serviceSlants('niell', 'chen-herring', out));
  return { kernel: Math.max(kernel, kernelAfter), niellFirst, niellAfter: Math.max(niellAfter, niellAfterAgain), others };
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
  const slant = slantThroughput();
  const m = (x: number) => (x / 1e6).toFixed(2);
  // The service runs in its own process; autocannon loads it from this one (2 cores: one each).
  const logged = await httpRatio({ LOG_LEVEL: 'info' });
  const quiet = await httpRatio({ LOG_LEVEL: 'warn' });
  const line = (name: string, r: { health: number; zenith: number; ratio: number }) =>
    `${name}: GET /v1/health ${r.health.toFixed(0)} req/s, POST /v1/zenith-delays (single point) ${r.zenith.toFixed(0)} req/s, ratio ${r.ratio.toFixed(2)} (target ≥ 0.6)`;
  return [
    `slant delays in-process (Niell + Chen & Herring, one core): ${m(slant.niellFirst)} million/s first, ${m(slant.niellAfter)} million/s after every model has run (target ≥ 5); hand-written kernel ${m(slant.kernel)} million/s; after/kernel ${(slant.niellAfter / slant.kernel).toFixed(2)} (target ≥ 0.8)`,
    `  every model (million/s): ${slant.others.join(', ')}`,
    line('HTTP, default configuration (LOG_LEVEL=info, one log line per request)', logged),
    line('HTTP, request logging off (LOG_LEVEL=warn)', quiet),
    '(medians of 3 alternating runs of 3 s, 10 connections, service in its own process)',
  ];
}
