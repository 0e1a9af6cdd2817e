#!/usr/bin/env node
/**
 * HTTP checks of container-smoke.sh against the running container (loopback only).
 *
 *   node http-checks.mjs wait BASE_URL SECONDS   polls GET /v1/health until 200 {"status":"ok"}
 *   node http-checks.mjs compute BASE_URL        POST /v1/zenith-delays: checks the numbers and a 400 problem;
 *                                                POST /v1/zwd-estimates (worker pool) and GET /v1/ready (waits up to 60 s for the warm-up)
 *   node http-checks.mjs pair BASE_URL OTHER_URL  two replicas on one database, key in SMOKE_KEY (reads need it):
 *                                                both ready; a station written through one is read through the
 *                                                other with the same key, and the other way round; no key -> 401
 *
 * Prints one line per check; exits 1 with the reason when one fails.
 */

const [command, baseUrl, secondsText] = process.argv.slice(2);
if (!baseUrl || !/^http:\/\/127\.0\.0\.1:\d+$/.test(baseUrl)) {
  fail(`usage: http-checks.mjs wait|compute http://127.0.0.1:PORT [SECONDS] (got ${baseUrl})`);
}

function fail(message) {
  process.stderr.write(`FAIL: ${message}\n`);
  process.exit(1);
}

async function waitHealthy(seconds) {
  const started = Date.now();
  let last = 'no answer yet';
  while (Date.now() - started < seconds * 1000) {
    try {
      const response = await fetch(`${baseUrl}/v1/health`, { signal: AbortSignal.timeout(2000) });
      const body = await response.json();
      if (response.status === 200 && body.status === 'ok') {
        console.log(`GET /v1/health -> 200 ${JSON.stringify(body)} after ${((Date.now() - started) / 1000).toFixed(1)} s`);
        return;
      }
      last = `${response.status} ${JSON.stringify(body)}`;
    } catch (err) {
      last = err instanceof Error ? (err.cause?.code ?? err.message) : String(err);
    }
    await new Promise((resolve) => setTimeout(resolve, 250));
  }
  fail(`GET /v1/health did not answer 200 within ${seconds} s (last: ${last})`);
}

/**
 * Zenith hydrostatic delay by Saastamoinen as given in the IERS Conventions (2010), eq. 9.11
 * (Davis et al. 1985): ZHD = 0.0022768 P / (1 - 0.00266 cos 2φ - 0.28e-6 H), P [hPa], φ latitude, H [m]
 * height, ZHD [m]. An independent computation, to catch a build that serves wrong numbers.
 */
function saastamoinenZhdM(pressureHpa, latitudeDeg, heightM) {
  return (0.0022768 * pressureHpa) / (1 - 0.00266 * Math.cos((2 * latitudeDeg * Math.PI) / 180) - 0.28e-6 * heightM);
}

async function compute() {
  // An invented site: mid-latitude, 180 m above the ellipsoid; met measured at the site.
  const site = { latitude_deg: 47.25, longitude_deg: 8.5, height_m: 180 };
  const met = { pressure_hpa: 1000, temperature_c: 15, relative_humidity_pct: 60 };
  const response = await fetch(`${baseUrl}/v1/zenith-delays`, {
    method: 'POST',
    headers: { 'content-type': 'application/json' },
    body: JSON.stringify({ site, epoch: '2026-03-14T12:00:00Z', met }),
    signal: AbortSignal.timeout(5000),
  });
  const body = await response.json();
  if (response.status !== 200) fail(`POST /v1/zenith-delays -> ${response.status} ${JSON.stringify(body)}`);
  const { zhd_m: zhd, zwd_m: zwd, ztd_m: ztd } = body;
  const expectedZhd = saastamoinenZhdM(met.pressure_hpa, site.latitude_deg, site.height_m);
  // Plausible ranges: common practice (sea-level ZTD is about 2.3-2.6 m; ZWD 0-0.4 m).
  if (!(ztd >= 2.2 && ztd <= 2.7)) fail(`ztd_m=${ztd} is outside the plausible 2.2-2.7 m`);
  if (!(zwd > 0 && zwd < 0.4)) fail(`zwd_m=${zwd} is outside the plausible 0-0.4 m at 15 °C, 60 %`);
  if (!(Math.abs(zhd - expectedZhd) < 0.001))
    fail(`zhd_m=${zhd} differs from IERS 2010 eq. 9.11 (${expectedZhd.toFixed(4)} m) by 1 mm or more`);
  if (!(Math.abs(ztd - (zhd + zwd)) < 1e-6)) fail(`ztd_m=${ztd} is not zhd_m + zwd_m`);
  console.log(
    `POST /v1/zenith-delays -> 200 zhd_m=${zhd.toFixed(4)} (IERS 2010 eq. 9.11: ${expectedZhd.toFixed(4)}) zwd_m=${zwd.toFixed(4)} ztd_m=${ztd.toFixed(4)}`,
  );

  const bad = await fetch(`${baseUrl}/v1/zenith-delays`, {
    method: 'POST',
    headers: { 'content-type': 'application/json' },
    body: JSON.stringify({ site, epoch: '2026-03-14T12:00:00Z', met: { ...met, pressure_hpa: 5000 } }),
    signal: AbortSignal.timeout(5000),
  });
  const problem = await bad.json();
  const type = bad.headers.get('content-type') ?? '';
  const named = JSON.stringify(problem).includes('pressure_hpa');
  if (bad.status !== 400 || !type.startsWith('application/problem+json') || !named) {
    fail(`pressure 5000 hPa -> ${bad.status} ${type} ${JSON.stringify(problem)} (want 400 problem+json naming pressure_hpa)`);
  }
  console.log(`POST /v1/zenith-delays with pressure_hpa=5000 -> 400 ${type.split(';')[0]} naming the field`);
}

/**
 * A small ZWD estimation, which runs in the image's worker-thread pool: residuals built from a known
 * correction of 0.02 m mapped with 1/sin e (close to the wet mapping above 15°) plus a large bias per
 * epoch; the estimate must come back near 0.02 m (within 2 mm: the cosecant differs from the Niell
 * wet function by up to 0.3 % at these elevations). Also checks GET /v1/ready.
 */
async function estimate() {
  const sky = [
    [15, 30],
    [25, 100],
    [40, 200],
    [60, 300],
    [75, 45],
    [33, 150],
    [20, 260],
  ];
  const observations = [];
  for (let k = 0; k < 12; k++) {
    const epoch = new Date(Date.UTC(2026, 2, 14, 0, 5 * k)).toISOString();
    sky.forEach(([e, a], s) => {
      const residual = 0.02 / Math.sin((e * Math.PI) / 180) + 0.5 * k;
      observations.push({ epoch, satellite: `X${s}`, elevation_deg: e, azimuth_deg: a, residual_m: Number(residual.toFixed(6)) });
    });
  }
  const response = await fetch(`${baseUrl}/v1/zwd-estimates`, {
    method: 'POST',
    headers: { 'content-type': 'application/json' },
    body: JSON.stringify({ site: { latitude_deg: 47.25, longitude_deg: 8.5, height_m: 180 }, observations, options: { gradients: null } }),
    signal: AbortSignal.timeout(20000),
  });
  const body = await response.json();
  if (response.status !== 200) fail(`POST /v1/zwd-estimates -> ${response.status} ${JSON.stringify(body)}`);
  const correction = body.zwd_nodes[0].correction_m;
  if (!(Math.abs(correction - 0.02) < 0.002)) fail(`estimated ZWD correction ${correction} m, want 0.02 ± 0.002 m`);
  console.log(`POST /v1/zwd-estimates (worker thread) -> 200, correction_m=${correction.toFixed(4)} (truth 0.02)`);

  // Ready once the workers' warm-up at start is done (TROPODELAY_WARM_UP_ESTIMATIONS; seconds, more on a busy
  // machine): while compute_warm_up is the only failing check the probe waits for it, any other failure fails now.
  const started = Date.now();
  for (;;) {
    const ready = await fetch(`${baseUrl}/v1/ready`, { signal: AbortSignal.timeout(5000) });
    const readyBody = await ready.json();
    if (ready.status === 200 && readyBody.status === 'ready') {
      console.log(`GET /v1/ready -> 200 ${JSON.stringify(readyBody)} after ${((Date.now() - started) / 1000).toFixed(1)} s more`);
      return;
    }
    const failing = Object.entries(readyBody.checks ?? {}).filter(([, outcome]) => outcome !== 'ok');
    const warming = failing.length === 1 && failing[0][0] === 'compute_warm_up';
    if (!warming || Date.now() - started > 60_000) fail(`GET /v1/ready -> ${ready.status} ${JSON.stringify(readyBody)}`);
    await new Promise((resolve) => setTimeout(resolve, 250));
  }
}

/** Two replicas sharing one database and one key set (docker/compose.yaml). */
async function pair(otherUrl) {
  const key = process.env.SMOKE_KEY;
  if (!key || !/^http:\/\/127\.0\.0\.1:\d+$/.test(otherUrl ?? '')) fail('usage: SMOKE_KEY=… http-checks.mjs pair URL OTHER_URL');
  const auth = { authorization: `Bearer ${key}` };
  for (const url of [baseUrl, otherUrl]) {
    const started = Date.now();
    let last = '';
    for (;;) {
      const r = await fetch(`${url}/v1/ready`, { signal: AbortSignal.timeout(5000) }).catch((err) => ({
        status: 0,
        json: async () => String(err),
      }));
      const body = await r.json();
      if (r.status === 200 && body.status === 'ready') break;
      last = `${r.status} ${JSON.stringify(body)}`;
      if (Date.now() - started > 60_000) fail(`GET ${url}/v1/ready did not become ready in 60 s (last: ${last})`);
      await new Promise((resolve) => setTimeout(resolve, 250));
    }
    console.log(`GET ${url}/v1/ready -> 200 ready`);
  }
  const station = { name: 'Saltmarsh Beacon (invented)', latitude_deg: 53.4, longitude_deg: 7.2, height_m: 12.5 };
  for (const [writer, reader, id] of [
    [baseUrl, otherUrl, 'SMOKE1'],
    [otherUrl, baseUrl, 'SMOKE2'],
  ]) {
    const put = await fetch(`${writer}/v1/stations/${id}`, {
      method: 'PUT',
      headers: { 'content-type': 'application/json', ...auth },
      body: JSON.stringify(station),
      signal: AbortSignal.timeout(5000),
    });
    if (put.status !== 201) fail(`PUT ${writer}/v1/stations/${id} -> ${put.status} ${await put.text()}`);
    const get = await fetch(`${reader}/v1/stations/${id}`, { headers: auth, signal: AbortSignal.timeout(5000) });
    const body = await get.json();
    if (get.status !== 200 || body.name !== station.name) fail(`GET ${reader}/v1/stations/${id} -> ${get.status} ${JSON.stringify(body)}`);
    console.log(`PUT ${writer}/v1/stations/${id} -> 201; GET through ${reader} with the same key -> 200 "${body.name}"`);
  }
  const anonymous = await fetch(`${otherUrl}/v1/stations/SMOKE1`, { signal: AbortSignal.timeout(5000) });
  if (anonymous.status !== 401) fail(`GET without a key -> ${anonymous.status}, want 401 (read keys required)`);
  console.log('GET without a key -> 401');
}

if (command === 'wait') await waitHealthy(Number(secondsText ?? '30'));
else if (command === 'pair') await pair(secondsText);
else if (command === 'compute') {
  await compute();
  await estimate();
} else fail(`unknown command ${command}`);
