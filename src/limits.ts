/**
 * Limits of the service, one definition each. The HTTP layer uses them for body limits, schema
 * ranges and route descriptions; the readers (src/formats) and services (src/services) for the
 * checks they make before any work. Nothing here imports anything.
 */

/** Body limit of the ZWD-estimation routes [bytes]: 64 MiB, room for 7 days of 30 s data (~160 000 observations, ~21 MB of JSON). */
export const ZWD_BODY_LIMIT_BYTES = 64 * 1024 * 1024;
/** Body limit of the batch routes (mapping factors, slant delays, PWV, series uploads) [bytes]: 32 MiB. */
export const BATCH_BODY_LIMIT_BYTES = 32 * 1024 * 1024;
/** Observations of one estimation. */
export const MAX_OBSERVATIONS = 500_000;
/** Met records of one estimation (sent or read from the archive), and of one series upload. */
export const MAX_MET_RECORDS = 100_000;
/** Longest node interval of an estimation [s]: 30 days. */
export const MAX_INTERVAL_S = 30 * 86_400;
/** Longest met gap interpolated across [s]: one day (also the window of stored met read around the observations). */
export const MAX_MET_GAP_S = 86_400;
/**
 * Longest text cell of an uploaded table (CSV, RINEX field) [characters]. Checked before any
 * pattern runs on the cell: the longest legitimate cell is an ISO epoch with an offset (~35) or
 * a satellite identifier (32).
 */
export const MAX_CELL_CHARS = 256;
/** Longest query-string value [characters], checked before any pattern runs on it. */
export const MAX_QUERY_VALUE_CHARS = 256;
/**
 * Largest body of an a-priori batch request (slant delays, mapping factors, precipitable water)
 * answered on the event loop [bytes]; a larger one is parsed, validated, computed and serialised in
 * the worker pool. 128 KiB is about 2 000 slant directions or 1 000 PWV records: below it the task's
 * hand-over (a millisecond or two) costs more than the work, above it the work would hold the loop.
 */
export const OFFLOAD_BODY_BYTES = 128 * 1024;
