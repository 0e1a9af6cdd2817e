/**
 * The request tasks that run in the worker pool (src/workers), by name: where each lives (module
 * and export, loaded by the worker thread) and, for the types of `app.compute.run`, what it is.
 * Adding a task: a function of plain data returning a TaskOutcome (src/http/tasks/ for request
 * work at the HTTP edge), one line in each of the two tables below.
 */

import type { TaskLocation } from '../workers/compute-pool.js';
import type { handleMappingFactorsRequest, handlePrecipitableWaterRequest, handleSlantDelaysRequest } from './tasks/apriori-batch.js';
import type { readDelayDepositTask, readMetJsonUploadTask } from './tasks/json-upload.js';
import type { readMetUploadTask } from './tasks/met-upload.js';
import type { handleNetworkDayRequest, handleNetworkRequest, scanNetworkRequest } from './tasks/network-request.js';
import type { scanZwdRequest, zwdRequestTask } from './tasks/zwd-request.js';
import type { readResidualDepositTask } from './tasks/residual-deposit.js';
import type { estimateCampaignItemTask } from './tasks/campaign-item.js';

export type ComputeTasks = {
  /** A whole POST .../zwd-estimates request: parse, validate, estimate, serialise (and for a station, the rows to store). */
  'zwd-estimate-request': typeof zwdRequestTask;
  /** A whole POST /v1/network-estimates or /v1/network/zwd-estimates request: parse, validate, estimate, serialise (and what to store). */
  'network-estimate-request': typeof handleNetworkRequest;
  /** First pass of a station's estimation: the epoch range of the observations and whether the body has met. */
  'zwd-request-scan': typeof scanZwdRequest;
  /** First pass of the storing network estimation: the epoch range, the stations and which have met in the body. */
  'network-request-scan': typeof scanNetworkRequest;
  /** POST /v1/network/days/{day}/zwd-estimates: the stations' deposits of the day decoded and estimated jointly (what to store). */
  'network-day-estimate': typeof handleNetworkDayRequest;
  /** A large POST /v1/slant-delays (body above OFFLOAD_BODY_BYTES): parse, validate, compute, serialise. */
  'slant-delays-request': typeof handleSlantDelaysRequest;
  /** A large POST /v1/mapping-factors, the same way. */
  'mapping-factors-request': typeof handleMappingFactorsRequest;
  /** A large POST /v1/precipitable-water, the same way. */
  'precipitable-water-request': typeof handlePrecipitableWaterRequest;
  /** A large text met upload (CSV or RINEX met): read and check the records; the route stores them. */
  'met-upload-read': typeof readMetUploadTask;
  /** A large JSON met upload: parse, check the envelope and every record; the route stores the rows. */
  'met-json-upload-read': typeof readMetJsonUploadTask;
  /** A large delay deposit (JSON), the same way. */
  'delay-deposit-read': typeof readDelayDepositTask;
  /** A residual deposit (one station-day): read, check, encode in the compact stored form. */
  'residual-deposit-read': typeof readResidualDepositTask;
  /** One campaign item (a station-day from its deposit): estimate; the runner stores the rows. */
  'campaign-item-estimate': typeof estimateCampaignItemTask;
};

export type ComputeTaskName = keyof ComputeTasks;

const ext = import.meta.url.endsWith('.ts') ? 'ts' : 'js';
const zwdRequestModule = new URL(`./tasks/zwd-request.${ext}`, import.meta.url).href;
const aprioriBatchModule = new URL(`./tasks/apriori-batch.${ext}`, import.meta.url).href;
const networkRequestModule = new URL(`./tasks/network-request.${ext}`, import.meta.url).href;
const metUploadModule = new URL(`./tasks/met-upload.${ext}`, import.meta.url).href;
const jsonUploadModule = new URL(`./tasks/json-upload.${ext}`, import.meta.url).href;
const residualDepositModule = new URL(`./tasks/residual-deposit.${ext}`, import.meta.url).href;
const campaignItemModule = new URL(`./tasks/campaign-item.${ext}`, import.meta.url).href;

export const COMPUTE_TASKS: { [K in ComputeTaskName]: TaskLocation } = {
  'zwd-estimate-request': { module: zwdRequestModule, exportName: 'zwdRequestTask' },
  'network-estimate-request': { module: networkRequestModule, exportName: 'handleNetworkRequest' },
  'zwd-request-scan': { module: zwdRequestModule, exportName: 'scanZwdRequest' },
  'network-request-scan': { module: networkRequestModule, exportName: 'scanNetworkRequest' },
  'network-day-estimate': { module: networkRequestModule, exportName: 'handleNetworkDayRequest' },
  'slant-delays-request': { module: aprioriBatchModule, exportName: 'handleSlantDelaysRequest' },
  'mapping-factors-request': { module: aprioriBatchModule, exportName: 'handleMappingFactorsRequest' },
  'precipitable-water-request': { module: aprioriBatchModule, exportName: 'handlePrecipitableWaterRequest' },
  'met-upload-read': { module: metUploadModule, exportName: 'readMetUploadTask' },
  'met-json-upload-read': { module: jsonUploadModule, exportName: 'readMetJsonUploadTask' },
  'delay-deposit-read': { module: jsonUploadModule, exportName: 'readDelayDepositTask' },
  'residual-deposit-read': { module: residualDepositModule, exportName: 'readResidualDepositTask' },
  'campaign-item-estimate': { module: campaignItemModule, exportName: 'estimateCampaignItemTask' },
};

/**
 * What each worker thread runs once at start (TROPODELAY_WARM_UP_ESTIMATIONS): estimations of an invented
 * slice through the request task (tasks/warm-up.ts), before its first request.
 */
export const COMPUTE_WARM_UP: TaskLocation = {
  module: new URL(`./tasks/warm-up.${ext}`, import.meta.url).href,
  exportName: 'warmUpEstimations',
};
