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
/**
 * Columns of an uploaded CSV table. The widest legitimate table (an observation table) has 6; a
 * header with more is refused before the table is parsed, so a header of 10^6 columns costs nothing.
 */
export const MAX_CSV_COLUMNS = 64;
/**
 * Output nodes of one estimation's answer (ZWD nodes plus gradient nodes), checked from the request's
 * time span and node intervals before any work. The largest legitimate answer: 30 days of ZWD nodes
 * at 30 s (86 401 nodes) with gradients at the default 6 h (121 nodes), rounded up; at ~310 bytes
 * of JSON per node (measured, 2-epoch request) the nodes of an answer take at most ~28 MB.
 */
export const MAX_ANSWER_NODES = 90_000;
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
