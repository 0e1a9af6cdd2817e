/**
 * Ray tracing through a spherically layered atmosphere (the shells of shells.ts).
 *
 * Within a shell the refractive index is the shell's mean and the ray is a straight chord; at the
 * boundaries it refracts by Bouguer's law for spherical layers (the spherical form of Snell's law,
 * e.g. Born & Wolf, Principles of Optics, §3.2; common practice in ray tracing):
 *
 *   n r cos θ = a (constant along the ray)
 *
 * θ is the local elevation of the ray. A chord from radius r1 (elevation θ1) to r2 has length
 * ds = (r2² − r1²)/(r2 sin θ2' + r1 sin θ1), with cos θ2' = r1 cos θ1 / r2, and advances the central
 * angle by θ2' − θ1 = asin(ds cos θ1 / r2) (law of sines in the triangle centre–entry–exit; this form
 * keeps full precision where the difference of the two angles would not).
 *
 * Definitions (issue 6):
 * - the launch (apparent) elevation θ0 is the ray's elevation at the antenna, in the lowest shell;
 * - the ray leaves the top of the column (n = 1 above) at local elevation θt, central angle ψ from
 *   the station; its direction seen from the station has the vacuum (geometric) elevation
 *   e = θt − ψ: the direction in which a distant satellite is seen from its orbit;
 * - refraction = θ0 − e;
 * - slant delay for a distant satellite = ∫n ds − (X_exit − X_station)·u, with u the outgoing unit
 *   direction: the optical path minus the geometric distance the vacuum path would have covered.
 *   Written as 1e-6 ∫N ds + [S − (X_exit − X_station)·u] with S = ∫ds; the bracket is the geometric
 *   bending term (≥ 0). The hydrostatic slant delay is 1e-6 ∫N_h ds plus the bending term, the wet
 *   slant delay 1e-6 ∫N_w ds: the bending is assigned to the hydrostatic part.
 *
 * `traceToVacuumElevation` iterates on the launch angle (secant steps kept inside a bracket, with
 * bisection as the fall-back) until the vacuum elevation is met within 1e-10 rad: at 5° the slant
 * delay changes by about 300 m per radian of elevation, so the iteration error is below 0.1 µm.
 *
 * Valid for launch angles [0, π/2] and vacuum elevations (0, π/2] (the API refuses 0 and below); a
 * direction no ray from the antenna reaches is a ModelDomainError (422), never a clamped answer.
 * The satellite is taken at infinity (parallel rays), the definition of issue 6.
 */

import { ModelDomainError } from '../errors.js';
import { PER_N_UNIT } from './constants.js';

/** What the tracer needs of a column: node radii and per-shell mean refractive index and refractivities. */
export interface TraceableColumn {
  radiusM: Float64Array;
  refractiveIndex: Float64Array;
  hydrostaticN: Float64Array;
  wetN: Float64Array;
  shells: number;
}

export interface RayTrace {
  /** Launch (apparent) elevation at the antenna [rad]. */
  launchRad: number;
  /** Vacuum elevation of the outgoing direction [rad]. */
  vacuumElevationRad: number;
  /** 1e-6 ∫N_h ds along the ray [m]. */
  hydrostaticExcessM: number;
  /** 1e-6 ∫N_w ds along the ray [m]. */
  wetExcessM: number;
  /** Geometric bending term S − (X_exit − X_station)·u [m]. */
  bendingM: number;
  /** Geometric length of the ray inside the column [m]. */
  pathLengthM: number;
  /** Central angle between the station and the exit point [rad]. */
  centralAngleRad: number;
}

/** Convergence threshold of the launch-angle iteration on the vacuum elevation [rad]. */
export const LAUNCH_TOLERANCE_RAD = 1e-10;
const MAX_ITERATIONS = 200;

/**
 * Traces one ray launched at θ0.
 *
 * @param column shells
 * @param launchRad launch elevation θ0 [rad], [0, π/2]
 * @returns the trace, or null when the ray cannot leave the column (turned back at a boundary where
 *          the refractive index drops: a duct)
 */
export function traceRay(column: TraceableColumn, launchRad: number): RayTrace | null {
  const { radiusM: r, refractiveIndex: n, hydrostaticN, wetN, shells } = column;
  const r0 = r[0]!;
  const a = n[0]! * r0 * Math.cos(launchRad);
  let pathLengthM = 0;
  let hydrostatic = 0;
  let wet = 0;
  let centralAngleRad = 0;
  for (let j = 0; j < shells; j++) {
    const nj = n[j]!;
    const r1 = r[j]!;
    const r2 = r[j + 1]!;
    const c1 = a / (nj * r1);
    if (c1 > 1) return null;
    const c2 = a / (nj * r2);
    const s1 = Math.sqrt((1 - c1) * (1 + c1));
    const s2 = Math.sqrt((1 - c2) * (1 + c2));
    const ds = ((r2 - r1) * (r2 + r1)) / (r2 * s2 + r1 * s1);
    centralAngleRad += Math.asin((c1 * ds) / r2); // law of sines in the triangle centre–entry–exit: no cancellation
    pathLengthM += ds;
    hydrostatic += hydrostaticN[j]! * ds;
    wet += wetN[j]! * ds;
  }
  const rTop = r[shells]!;
  const cTop = a / rTop; // n = 1 above the column
  const thetaTop = Math.atan2(Math.sqrt((1 - cTop) * (1 + cTop)), cTop);
  const vacuumElevationRad = thetaTop - centralAngleRad;
  // r_top cos ψ − r0 written as (r_top − r0) − 2 r_top sin²(ψ/2) to keep its digits.
  const halfAngleSin = Math.sin(centralAngleRad / 2);
  const rise = rTop - r0 - 2 * rTop * halfAngleSin * halfAngleSin;
  const projection = rTop * Math.sin(centralAngleRad) * Math.cos(vacuumElevationRad) + rise * Math.sin(vacuumElevationRad);
  return {
    launchRad,
    vacuumElevationRad,
    hydrostaticExcessM: PER_N_UNIT * hydrostatic,
    wetExcessM: PER_N_UNIT * wet,
    bendingM: pathLengthM - projection,
    pathLengthM,
    centralAngleRad,
  };
}

/**
 * Finds the ray that leaves the column at a given vacuum elevation.
 *
 * @param column shells
 * @param vacuumElevationRad target vacuum elevation e [rad], (0, π/2]
 * @param field API field named in an error, e.g. "elevations_deg.3"
 * @throws ModelDomainError (422) when no ray from the antenna leaves the column in that direction
 */
export function traceToVacuumElevation(column: TraceableColumn, vacuumElevationRad: number, field: string): RayTrace {
  const half = Math.PI / 2;
  if (vacuumElevationRad >= half) return traceRay(column, half)!;
  let lo = 0; // f(lo) < 0 or trapped
  let hi = half; // f(hi) ≥ 0: the zenith ray leaves at the zenith
  let x = vacuumElevationRad; // refraction lifts the launch angle above the vacuum elevation
  let previous: { x: number; f: number } | null = null;
  let lowestEscaping: RayTrace | null = null;
  for (let iteration = 0; iteration < MAX_ITERATIONS; iteration++) {
    const trace = traceRay(column, x);
    let next: number;
    if (trace === null) {
      lo = x;
      previous = null;
      next = (lo + hi) / 2;
    } else {
      const f = trace.vacuumElevationRad - vacuumElevationRad;
      if (Math.abs(f) < LAUNCH_TOLERANCE_RAD) return trace;
      if (f < 0) lo = x;
      else {
        hi = x;
        lowestEscaping = trace;
      }
      next = previous && previous.f !== f ? x - (f * (x - previous.x)) / (f - previous.f) : x - f;
      previous = { x, f };
      if (!(next > lo && next < hi)) next = (lo + hi) / 2;
    }
    if (hi - lo < 1e-15) break;
    x = next;
  }
  const toDeg = (rad: number) => ((rad * 180) / Math.PI).toFixed(4);
  throw new ModelDomainError(
    field,
    lowestEscaping
      ? `no ray from the antenna leaves the atmosphere at vacuum elevation ${toDeg(vacuumElevationRad)}°: rays launched below ${toDeg(lowestEscaping.launchRad)}° are trapped by the profile (a duct), and the lowest escaping ray leaves at ${toDeg(lowestEscaping.vacuumElevationRad)}°`
      : `the launch-angle iteration did not reach vacuum elevation ${toDeg(vacuumElevationRad)}° within ${MAX_ITERATIONS} steps`,
  );
}
