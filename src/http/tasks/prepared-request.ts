/**
 * A ZWD-estimation request body parsed and checked once (the scan of a station's estimation,
 * src/http/tasks/zwd-request.ts), as it travels from one worker through the event loop to the next
 * without being parsed again. Small on purpose: the station route imports it on the event loop.
 */

import type { ZwdEstimationBody } from '../schemas/zwd-estimates.js';

/**
 * A request body parsed and checked once, as it travels between threads: the observations as typed
 * columns (moved, not copied; satellites as indices into their distinct names; σ NaN where a row has
 * none) and the rest of the body as validated plain data.
 */
export interface PreparedRequest {
  body: Omit<ZwdEstimationBody, 'observations'>;
  epochMs: Float64Array;
  satelliteIndex: Uint32Array;
  satellites: string[];
  elevationRad: Float64Array;
  azimuthRad: Float64Array;
  residualM: Float64Array;
  sigmaM?: Float64Array | undefined;
}

/** The array buffers of a prepared request, to move with it to a worker. */
export const preparedBuffers = (p: PreparedRequest): ArrayBuffer[] =>
  [p.epochMs, p.satelliteIndex, p.elevationRad, p.azimuthRad, p.residualM, ...(p.sigmaM ? [p.sigmaM] : [])].map(
    (a) => a.buffer as ArrayBuffer,
  );
