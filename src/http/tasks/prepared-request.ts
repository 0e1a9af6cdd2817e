/**
 * A ZWD-estimation request body parsed and checked once (the scan of a station's estimation,
 * src/http/tasks/zwd-request.ts; the scan of the storing network route, src/http/tasks/network-request.ts),
 * as it travels from one worker through the event loop to the next without being parsed again. Small on
 * purpose: the station and network routes import it on the event loop.
 */

import type { NetworkEstimatesRequest, NetworkStoredEstimatesRequest } from '../schemas/network-estimates.js';
import type { ZwdEstimationBody } from '../schemas/zwd-estimates.js';

/**
 * Observations parsed and checked once, as typed columns that travel between threads (moved, not copied):
 * satellites as indices into their distinct names, σ NaN where a row has none.
 */
export interface PreparedObservationColumns {
  epochMs: Float64Array;
  satelliteIndex: Uint32Array;
  satellites: string[];
  elevationRad: Float64Array;
  azimuthRad: Float64Array;
  residualM: Float64Array;
  sigmaM?: Float64Array | undefined;
}

/** A station's request body parsed and checked once: the observations as columns, the rest as validated plain data. */
export interface PreparedRequest extends PreparedObservationColumns {
  body: Omit<ZwdEstimationBody, 'observations'>;
}

/** The checked rest of a network request body (stations, met, options; no observations). */
export type NetworkRequestRest = Pick<NetworkEstimatesRequest, 'met' | 'options'> & {
  stations: NetworkStoredEstimatesRequest['stations'] | NetworkEstimatesRequest['stations'];
};

/**
 * A network request body parsed and checked once (scanNetworkRequest), as it travels to the estimation task:
 * the observations as columns with their stations as indices into the distinct names; the rest of the body as
 * validated plain data.
 */
export interface PreparedNetworkRequest extends PreparedObservationColumns {
  body: NetworkRequestRest;
  /** The observations came as column arrays (JSON or Arrow): the estimator's errors then name the column first. */
  columnar: boolean;
  stationIndex: Uint32Array;
  stations: string[];
}

/**
 * The array buffers of prepared columns (and of `more` typed arrays beside them), to move with them to a worker:
 * each buffer once (a transfer list naming one twice is refused), should two columns ever share one.
 */
function columnBuffers(p: PreparedObservationColumns, more: ArrayBufferView[] = []): ArrayBuffer[] {
  const arrays = [...more, p.epochMs, p.satelliteIndex, p.elevationRad, p.azimuthRad, p.residualM, ...(p.sigmaM ? [p.sigmaM] : [])];
  return [...new Set(arrays.map((a) => a.buffer as ArrayBuffer))];
}

/** The array buffers of a prepared request, to move with it to a worker. */
export const preparedBuffers = (p: PreparedRequest): ArrayBuffer[] => columnBuffers(p);

/** The array buffers of a prepared network request, to move with it to a worker. */
export const preparedNetworkBuffers = (p: PreparedNetworkRequest): ArrayBuffer[] => columnBuffers(p, [p.stationIndex]);
