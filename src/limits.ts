/**
 * Limits of the service, one definition each. The HTTP layer uses them for body limits, schema
 * ranges and route descriptions; the readers (src/formats) and services (src/services) for the
 * checks they make before any work. Nothing here imports anything.
 */

/**
 * Body limit of the ZWD-estimation routes [bytes]: 96 MiB, room for MAX_OBSERVATIONS as column arrays
 * (30 GPS-like days without gaps, ~826 000 observations, are ~73 MB as columns JSON, ~31 MB as Arrow;
 * as JSON objects ~130 MB, above it: send long spans as columns, Arrow or CSV).
 */
export const ZWD_BODY_LIMIT_BYTES = 96 * 1024 * 1024;
/** Body limit of the batch routes (mapping factors, slant delays, PWV, series uploads) [bytes]: 32 MiB. */
export const BATCH_BODY_LIMIT_BYTES = 32 * 1024 * 1024;
/**
 * Memory a worker task takes while it runs, per byte of its request body, by the body's form (the
 * compute pool's memory budget, TROPODELAY_COMPUTE_MEMORY_BUDGET_MB). Measured (issue 14,
 * bench/service-memory.child.ts: peak resident set of the whole estimation task in one process over
 * the set before it, 17 GPS-like days, 467 790 observations): columns JSON 41.3 MB → +240 MB (5.8 per
 * byte; its steps one by one, each kept, +285 MB: 6.9), Arrow 16.3 MB → +187 MB (11.5). CSV rows become
 * objects before the checks: taken as 10 (not measured). JSON objects: as columns (more bytes per
 * observation, more work per byte).
 */
export const TASK_MEMORY_PER_BODY_BYTE = { json: 7, arrow: 12, csv: 10 } as const;
/**
 * Memory of a network day from residual deposits (POST /v1/network/days/{day}/zwd-estimates, no body) in
 * the pool's memory budget, per station × observation [bytes]: `npm run bench -- network-day`, 50 stations,
 * 2.37 M observations (118.5 M), peak RSS 1 869 MB of a fresh service process, about 150 MB of it before
 * the request: (1 869 − 150) MB / 118.5 M ≈ 14.5, taken as 15.
 */
export const NETWORK_DAY_MEMORY_PER_STATION_OBSERVATION = 15;
/**
 * Observations of one estimation (and of one network estimation, residual deposit or observation CSV):
 * 30 days of data from one constellation of 30 satellites at 30 s (7–11 in view: ~826 000 without
 * gaps, test/helpers/gps-like-days.ts; issue 14), with room for 12 in view; counted while the body
 * arrives. Such a request runs alone in the worker pool (its memory estimate is above
 * TROPODELAY_COMPUTE_MEMORY_BUDGET_MB); its peak memory: README, Benchmarks, row memory.
 */
export const MAX_OBSERVATIONS = 900_000;
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
/**
 * Ranges of a stored delay series [m]: a deposit outside them is refused, and so is a station
 * estimation whose result falls outside them (it must never store what a deposit could not).
 * ZTD 1..3 m: sea-level ZHD ≈ 2.3 m plus ZWD 0..0.5 m, down to ~1.3 m ZHD at 9 km (common practice);
 * horizontal gradients ±50 mm (observed values are a few mm; common practice).
 */
export const STORED_ZTD_RANGE_M = [1, 3] as const;
export const STORED_ZWD_RANGE_M = [0, 1] as const;
export const STORED_GRADIENT_RANGE_M = [-0.05, 0.05] as const;
/**
 * Largest body of an a-priori batch request (slant delays, mapping factors, precipitable water)
 * answered on the event loop [bytes]; a larger one is parsed, validated, computed and serialised in
 * the worker pool. 128 KiB is about 2 000 slant directions or 1 000 PWV records: below it the task's
 * hand-over (a millisecond or two) costs more than the work, above it the work would hold the loop.
 */
export const OFFLOAD_BODY_BYTES = 128 * 1024;
/**
 * What a byte of an a-priori batch costs on the event loop, by the form of its rows, relative to a
 * byte of rows as JSON objects (the form OFFLOAD_BODY_BYTES was set for). A body stays on the loop
 * while its bytes × this weight ≤ OFFLOAD_BODY_BYTES, so every form holds the loop about as long.
 * Measured (issue 14, CPU time of the whole task in-process, slant delays, 2 000–10 000 directions,
 * load average 10–15): JSON objects ~75 ns/byte (parse, zod per row, stringify), JSON column arrays
 * ~32 ns/byte (one check loop, numbers written in one pass), Arrow IPC ~14 ns/byte (typed columns,
 * no parse). So 10 000 directions as columns (~250 kB) or Arrow (~160 kB) stay on the loop (the
 * hand-over to a worker cost more than their work), the same directions as objects (~450 kB) do not.
 */
export const OFFLOAD_COST_PER_BYTE = { jsonRows: 1, jsonColumns: 32 / 75, arrow: 14 / 75 } as const;
/**
 * Stations of one network estimation (POST /v1/network-estimates). The estimator's cost per epoch
 * grows as the square of the stations (every epoch's reduced matrix is dense in all stations).
 */
export const MAX_NETWORK_STATIONS = 100;
/**
 * Stations × observations of one network estimation, checked before any work: the size of the
 * work (the design, the per-epoch clock elimination) in one request. 5 000 000 holds a 10-station
 * day of 30-s data (~0.47 M observations; ~31 MB as text/csv, within ZWD_BODY_LIMIT_BYTES) or 25
 * stations over about 7 hours; larger networks go through the archive (residual deposits and
 * POST /v1/network/days/{day}/zwd-estimates, MAX_NETWORK_DAY_STATION_OBSERVATIONS).
 */
export const MAX_NETWORK_STATION_OBSERVATIONS = 5_000_000;
/**
 * Stations × observations of one network estimation from residual deposits
 * (POST /v1/network/days/{day}/zwd-estimates; no body to carry them), by default: a 50-station day of
 * 30-s data with about 18 satellites in view (2.6 M observations, 130 M) fits. Through HTTP such a day
 * costs about 54 s of CPU time and a peak RSS of 1.9 GB (docs/benchmark-history.md, network-day);
 * TROPODELAY_NETWORK_DAY_MAX_STATION_OBSERVATIONS lowers it for replicas with less memory.
 */
export const MAX_NETWORK_DAY_STATION_OBSERVATIONS = 150_000_000;
/**
 * Data coverage (GET /v1/network/coverage): a gap is a spacing between consecutive records longer
 * than gap_min_s [s], default one hour (the step of the hourly products: a longer hole leaves an
 * hour without a value); from one minute to one year. At most COVERAGE_MAX_GAPS_LIMIT gaps listed per
 * station and source (the longest; all are counted), default COVERAGE_DEFAULT_MAX_GAPS.
 */
export const COVERAGE_DEFAULT_GAP_MIN_S = 3600;
export const COVERAGE_GAP_MIN_RANGE_S = [60, 366 * 86_400] as const;
export const COVERAGE_DEFAULT_MAX_GAPS = 20;
export const COVERAGE_MAX_GAPS_LIMIT = 1000;

/** Station-days (items) of one reprocessing campaign at most (src/services/campaigns; POST /v1/campaigns). */
export const MAX_CAMPAIGN_ITEMS = 100_000;
/** Stations named in one campaign at most. */
export const MAX_CAMPAIGN_STATIONS = 10_000;
