/**
 * The warm-up of an estimation worker thread (TROPODELAY_WARM_UP_ESTIMATIONS): the thread runs the
 * real request task (zwdRequestTask: JSON columns reader → validation → estimate → rows answer writer)
 * on an invented observation slice a number of times before it takes its first request, so that V8 has
 * compiled the hot code (TurboFan) by then. Measured before (issue 14): a fresh replica's first
 * estimation request cost 282–346 ms, its requests 5–44 on a fresh worker 40–59 ms against 32–37 ms warm.
 *
 * The slice is INVENTED: no real station, satellite or data. A site at 47.5° N 8.25° E, 420 m, three hours
 * at 30 s of 30 satellites on circular orbits of GPS-like figures (six planes of five, 55°, 26 560 km;
 * nominal values from memory), those above 7° seen; residuals = a smooth ZWD of about 0.15 m through
 * Niell's wet mapping (Niell 1996, the service's own coefficients) + an epoch clock (a random walk) + 3 mm
 * of white noise / sin e, with a few gross errors so that the screening's paths run too. Nothing is stored,
 * nothing reaches the metrics: the task is called directly, not through the pool's `run`.
 *
 * Registered by its owner (src/http/compute-tasks.ts COMPUTE_WARM_UP) and called by the worker thread's
 * entry (src/workers/compute-worker.ts) once at thread start.
 */

import { DEG } from '../../domain/constants.js';
import { geodeticToEcef, lookAngles } from '../../domain/geometry/topocentric.js';
import { marini } from '../../domain/mapping/continued-fraction.js';
import { niellWetCoefficients } from '../../domain/mapping/niell.js';
import { mulberry32 } from '../../seeded-random.js';
import { zwdRequestTask } from './zwd-request.js';

/** Mean motion of the invented orbits: √(GM / r³) with GM = 3.986004418e14 m³/s² (IERS 2010, from memory). */
const ORBIT_RADIUS_M = 26_560_000;
const MEAN_MOTION_RAD_S = Math.sqrt(3.986004418e14 / ORBIT_RADIUS_M ** 3);
/** Earth rotation rate [rad/s] (WGS84, from memory). */
const EARTH_ROTATION_RAD_S = 7.2921151467e-5;
const INCLINATION_RAD = 55 * DEG;
const PLANES = 6;
const PER_PLANE = 5;
const SAMPLING_S = 30;
const DURATION_S = 3 * 3600;
const CUTOFF_RAD = 7 * DEG;
const START_MS = Date.parse('2026-06-21T00:00:00Z');
const SITE = { latitude_deg: 47.5, longitude_deg: 8.25, height_m: 420 };

/** The invented slice as the estimation API's columns JSON body (UTF-8), the form most callers send. */
export function warmUpBody(): Uint8Array {
  const uniform = mulberry32(20261204);
  const latRad = SITE.latitude_deg * DEG;
  const lonRad = SITE.longitude_deg * DEG;
  const site = geodeticToEcef(latRad, lonRad, SITE.height_m);
  const wet = niellWetCoefficients(latRad);
  const epoch: string[] = [];
  const satellite: string[] = [];
  const elevation: number[] = [];
  const azimuth: number[] = [];
  const residual: number[] = [];
  let clockM = 1000;
  for (let tS = 0; tS < DURATION_S; tS += SAMPLING_S) {
    const iso = new Date(START_MS + tS * 1000).toISOString();
    const zwdM = 0.15 + 0.02 * Math.sin((2 * Math.PI * tS) / 86_400);
    clockM += 30 * (uniform() - 0.5);
    const theta = EARTH_ROTATION_RAD_S * tS;
    for (let p = 0; p < PLANES; p++) {
      const raan = (2 * Math.PI * p) / PLANES - theta; // the plane's node in the Earth-fixed frame
      for (let q = 0; q < PER_PLANE; q++) {
        const u = MEAN_MOTION_RAD_S * tS + (2 * Math.PI * q) / PER_PLANE + (2 * Math.PI * p) / (PLANES * PER_PLANE);
        const xOrbit = ORBIT_RADIUS_M * Math.cos(u);
        const yOrbit = ORBIT_RADIUS_M * Math.sin(u);
        const target = {
          xM: xOrbit * Math.cos(raan) - yOrbit * Math.cos(INCLINATION_RAD) * Math.sin(raan),
          yM: xOrbit * Math.sin(raan) + yOrbit * Math.cos(INCLINATION_RAD) * Math.cos(raan),
          zM: yOrbit * Math.sin(INCLINATION_RAD),
        };
        const look = lookAngles(latRad, lonRad, site, target);
        if (look.elevationRad < CUTOFF_RAD) continue;
        const sinE = Math.sin(look.elevationRad);
        let errorM = (0.003 * (uniform() + uniform() + uniform() - 1.5) * 2) / sinE;
        if (uniform() < 0.002) errorM += (uniform() < 0.5 ? -1 : 1) * 0.3; // a gross error now and then
        epoch.push(iso);
        satellite.push(`S${String(p * PER_PLANE + q + 1).padStart(2, '0')}`);
        elevation.push(look.elevationRad / DEG);
        azimuth.push(look.azimuthRad / DEG);
        residual.push(zwdM * marini(sinE, wet.a, wet.b, wet.c) + clockM + errorM);
      }
    }
  }
  const body = {
    site: SITE,
    apriori: { zhd_m: 2.2 },
    observations: { epoch, satellite, elevation_deg: elevation, azimuth_deg: azimuth, residual_m: residual },
  };
  return new TextEncoder().encode(JSON.stringify(body));
}

/**
 * Runs `estimations` estimation requests of the invented slice through the request task, as a worker
 * thread does before its first request. Throws when one is not answered (it should never be: the slice is
 * valid), so that the thread can report the failure.
 */
export async function warmUpEstimations(estimations: number): Promise<void> {
  const body = warmUpBody();
  for (let i = 0; i < estimations; i++) {
    // The task drops the body it was given (zwdRequestTask owns its input): a copy each time.
    const outcome = await zwdRequestTask({ body: body.slice(), format: 'json', query: {}, queryKeys: [] });
    if (!outcome.ok) throw new Error(`warm-up estimation refused: ${outcome.error.status} ${outcome.error.detail}`);
  }
}
